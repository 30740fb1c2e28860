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

describe('unknown API paths', () => {
  it('answers JSON 404 naming the whole path, without the query string', async () => {
    const a = await agentWithCsrf(t.app)
    const res = await a.get('/api/nowhere/at-all?token=secret')
    expect(res.status).toBe(404)
    expect(res.body.error.message).toBe('There is no GET /api/nowhere/at-all.')
  })
})
