import { randomUUID } from 'node:crypto'
import fs from 'node:fs'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { createLogger } from '../../server/log/logger'
import { agentWithCsrf, makeTestApp, type TestApp } from '../helpers/testApp'
import { entryPayload, linkUp, makeTherapist, signedInAs } from './linkFixtures'

const lines: string[] = []
let t: TestApp
beforeAll(async () => {
  const destination = { write: (line: string) => { lines.push(line) } }
  t = await makeTestApp({ LOG_REQUESTS: 'true' }, {}, { log: createLogger({ level: 'debug', destination }) })
})
afterAll(async () => { await t.close() })

const logText = () => lines.join('')

describe('the server log', () => {
  it('carries request ids and never passwords, entry text, cookies, session ids, CSRF tokens or query strings', async () => {
    const password = `pw-${randomUUID()}`
    const email = `log.check.${randomUUID().slice(0, 6)}@example.org`
    const secretBody = `secret-body-${randomUUID()}`
    const person = await agentWithCsrf(t.app)
    const csrfBefore = person.token
    const signup = await person.post('/api/auth/signup', { role: 'person', email, password, displayName: 'Logan Quill' })
    expect(signup.status).toBe(202)
    await t.deps.models.User.update({ emailVerifiedAt: new Date() }, { where: { email } })
    const signin = await person.signIn(email, password)
    expect(signin.status).toBe(200)
    const setCookie = ([] as string[]).concat(signin.headers['set-cookie'] ?? [])
    const cookieValue = setCookie.find((c) => c.startsWith('rungs.sid='))!.split(';')[0]!.slice('rungs.sid='.length)
    const sessionId = decodeURIComponent(cookieValue).replace(/^s:/, '').split('.')[0]!
    expect(sessionId.length).toBeGreaterThan(10)
    expect(await t.deps.models.User.count({ where: { email } })).toBe(1)

    const therapist = await signedInAs(t, await makeTherapist(t, 'Ida Lumen'))
    const linkId = await linkUp(therapist, person)
    const entryId = randomUUID()
    const requestId = `test-${randomUUID()}`
    const share = await person.agent
      .put(`/api/links/${linkId}/shares/${entryId}?token=query-secret-${requestId}`)
      .set('x-csrf-token', person.token)
      .set('X-Request-Id', requestId)
      .send({ version: 1, payload: { ...entryPayload(entryId, 1, 'marker'), body: secretBody } })
    expect(share.status).toBe(200)
    expect(share.headers['x-request-id']).toBe(requestId)
    const stored = await t.deps.models.SharedEntry.findOne({ where: { linkId, entryId } })
    expect(JSON.parse(stored!.payload!).body).toBe(secretBody)

    const text = logText()
    expect(text).toContain(requestId)
    for (const secret of [password, secretBody, cookieValue, sessionId, csrfBefore, person.token, `query-secret-${requestId}`, 'marker want', 'Logan Quill']) {
      expect(text, `log holds ${secret.slice(0, 12)}…`).not.toContain(secret)
    }
    // Every line is one JSON object; request lines name a path without any query string.
    const entries = lines.map((l) => JSON.parse(l) as { reqId?: string; req?: { path?: string }; msg?: string })
    const put = entries.find((e) => e.reqId === requestId && e.req)
    expect(put?.req?.path).toBe(`/api/links/${linkId}/shares/${entryId}`)
    expect(put?.msg).toMatch(/^PUT \/api\/links\/\S+ 200 \d+ms$/)
  })

  it('replaces an unsafe incoming X-Request-Id with a fresh UUID', async () => {
    for (const bad of ['short', 'has space in it', 'new\nline-injected', 'x'.repeat(200), '<script>alert(1)</script>']) {
      const res = await (await agentWithCsrf(t.app)).agent.get('/api/me').set('X-Request-Id', bad.replace('\n', ' '))
      expect(res.headers['x-request-id']).toMatch(/^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/)
    }
  })

  it('logs an internal error with its request id, and the answer carries the same id', async () => {
    const broken = await makeTestApp({}, {}, { log: createLogger({ level: 'info', destination: { write: (l: string) => { lines.push(l) } } }) })
    const a = await agentWithCsrf(broken.app)
    await broken.deps.sequelize.close()
    try {
      const res = await a.agent.post('/api/auth/signin').set('x-csrf-token', a.token).send({ email: 'someone@example.org', password: 'a password of some length' })
      expect(res.status).toBe(500)
      const id = res.headers['x-request-id'] as string
      const errorLine = lines.map((l) => JSON.parse(l) as { level: number; reqId?: string; err?: { message?: string } }).find((e) => e.reqId === id && e.level >= 50 && e.err)
      expect(errorLine?.err?.message).toBeTruthy()
      expect(logText()).not.toContain('a password of some length')
    } finally {
      broken.app.stop()
      broken.deps.mailer.close()
      await broken.deps.fakeSmtp.close()
      fs.rmSync(broken.dataDir, { recursive: true, force: true })
    }
  })

  it('with LOG_REQUESTS off logs no request lines but still sets the request id', async () => {
    const quiet: string[] = []
    const q = await makeTestApp({ LOG_REQUESTS: 'false' }, {}, { log: createLogger({ destination: { write: (l: string) => { quiet.push(l) } } }) })
    try {
      const res = await (await agentWithCsrf(q.app)).agent.get('/api/me')
      expect(res.status).toBe(401)
      expect(res.headers['x-request-id']).toBeTruthy()
      expect(quiet.filter((l) => l.includes('"req"'))).toEqual([])
    } finally {
      await q.close()
    }
  })
})
