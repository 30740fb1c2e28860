import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { demoAccounts } from '../../server/db/seed'
import { agentWithCsrf, makeTestApp, type TestApp } from '../helpers/testApp'

let t: TestApp
beforeAll(async () => { t = await makeTestApp() })
afterAll(async () => { await t.close() })

describe('GET /api/me', () => {
  it('answers 401 in the error shape when nobody is signed in', async () => {
    const a = await agentWithCsrf(t.app)
    const res = await a.get('/api/me')
    expect(res.status).toBe(401)
    expect(res.body).toEqual({ error: { code: 'unauthenticated', message: expect.any(String) } })
  })
  it('returns the signed-in person without the password hash', async () => {
    const a = await agentWithCsrf(t.app)
    expect((await a.signIn(demoAccounts.person.email, demoAccounts.person.password)).status).toBe(200)
    const res = await a.get('/api/me')
    expect(res.body.user).toMatchObject({ email: demoAccounts.person.email, role: 'person' })
    expect(JSON.stringify(res.body)).not.toContain('scrypt')
  })
})
