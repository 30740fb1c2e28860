import supertest from 'supertest'
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest'
import { hashPassword } from '../../server/auth/password'
import { agentWithCsrf, makeTestApp, type TestApp } from '../helpers/testApp'

let t: TestApp
// The app's clock (deps.now) drives the timeouts, so the tests move time instead of waiting for it.
let clockMs = Date.now()
beforeAll(async () => {
  t = await makeTestApp({ SIGNIN_LIMIT: '1000', SESSION_IDLE_MINUTES: '30', SESSION_ABSOLUTE_HOURS: '12' })
  t.deps.now = () => new Date(clockMs)
})
afterAll(async () => { await t.close() })
beforeEach(() => { clockMs = Date.now() })

const MIN = 60_000
const password = 'slate roofs after the hailstorm'
let n = 0
async function makeUser() {
  return t.deps.models.User.create({
    email: `sessions-${++n}@example.test`, passwordHash: await hashPassword(password, t.deps.config.scryptCost), role: 'person', displayName: 'Tamsin', emailVerifiedAt: new Date(), disabledAt: null,
  })
}
async function signedIn() {
  const user = await makeUser()
  const a = await agentWithCsrf(t.app)
  expect((await a.signIn(user.email, password)).status).toBe(200)
  return { user, a }
}

/** The session id inside a signed `rungs.sid` cookie value (`s:<sid>.<signature>`). */
function sidCookie(res: { headers: Record<string, unknown> }): { cookie: string; sid: string } {
  const found = ((res.headers['set-cookie'] ?? []) as string[]).find((c) => c.startsWith('rungs.sid='))
  if (!found) throw new Error('no rungs.sid cookie was set')
  const cookie = found.split(';')[0]!
  const sid = decodeURIComponent(cookie.slice('rungs.sid='.length)).replace(/^s:/, '').replace(/\.[^.]*$/, '')
  return { cookie, sid }
}

const rowsOf = (userId: string) => t.deps.models.Session.count({ where: { userId } })
const EXPIRED = { error: { code: 'session_expired', message: 'You were signed out after a while without use. Sign in again; nothing on this device is lost.' } }

describe('session id rotation at sign-in', () => {
  it('hands out a new session id at sign-in, and the id from before no longer works', async () => {
    const user = await makeUser()
    const agent = supertest.agent(t.app)
    const csrf = await agent.get('/api/auth/csrf').expect(200)
    const before = sidCookie(csrf)
    expect(await t.deps.models.Session.findByPk(before.sid)).not.toBeNull()

    const res = await agent.post('/api/auth/signin').set('x-csrf-token', csrf.body.csrfToken).send({ email: user.email, password })
    expect(res.status).toBe(200)
    const after = sidCookie(res)
    expect(after.sid).not.toBe(before.sid)
    expect(await t.deps.models.Session.findByPk(before.sid)).toBeNull()
    expect((await t.deps.models.Session.findByPk(after.sid))?.userId).toBe(user.id)

    expect((await supertest(t.app).get('/api/me').set('Cookie', before.cookie)).status).toBe(401)
    expect((await supertest(t.app).get('/api/me').set('Cookie', after.cookie)).status).toBe(200)
  })
})

describe('POST /api/auth/signout-everywhere', () => {
  it('ends every session of the account on every device, this one included, and leaves other accounts signed in', async () => {
    const { user, a: phone } = await signedIn()
    const laptop = await agentWithCsrf(t.app)
    await laptop.signIn(user.email, password)
    const other = await signedIn()
    expect(await rowsOf(user.id)).toBe(2)

    const res = await phone.post('/api/auth/signout-everywhere')
    expect(res.status).toBe(200)
    expect(res.body.message).toContain('The journal on this device stays here.')
    expect(await rowsOf(user.id)).toBe(0)
    expect((await phone.get('/api/me')).status).toBe(401)
    expect((await laptop.get('/api/me')).status).toBe(401)
    expect(await rowsOf(user.id)).toBe(0)

    expect((await other.a.get('/api/me')).status).toBe(200)
    expect(await rowsOf(other.user.id)).toBe(1)
    expect((await phone.signIn(user.email, password)).status).toBe(403) // the old CSRF token went with the session
  })

  it('refuses without the CSRF token and ends nothing', async () => {
    const { user, a } = await signedIn()
    const res = await a.agent.post('/api/auth/signout-everywhere').send({})
    expect(res.status).toBe(403)
    expect(res.body.error.code).toBe('csrf')
    expect(await rowsOf(user.id)).toBe(1)
    expect((await a.get('/api/me')).status).toBe(200)
  })

  it('answers 401 when nobody is signed in', async () => {
    const a = await agentWithCsrf(t.app)
    const sessionsBefore = await t.deps.models.Session.count()
    const res = await a.post('/api/auth/signout-everywhere')
    expect(res.status).toBe(401)
    expect(res.body.error.code).toBe('unauthenticated')
    expect(await t.deps.models.Session.count()).toBe(sessionsBefore)
  })
})

describe('idle timeout (SESSION_IDLE_MINUTES)', () => {
  it('keeps a session in use alive, ends it after 30 idle minutes with session_expired, and removes the row', async () => {
    const { user, a } = await signedIn()
    clockMs += 29 * MIN
    expect((await a.get('/api/me')).status).toBe(200)
    clockMs += 29 * MIN
    expect((await a.get('/api/me')).status).toBe(200)
    expect(await rowsOf(user.id)).toBe(1)

    clockMs += 31 * MIN
    const res = await a.get('/api/me')
    expect(res.status).toBe(401)
    expect(res.body).toEqual(EXPIRED)
    expect(await rowsOf(user.id)).toBe(0)
    const again = await a.get('/api/me')
    expect(again.body.error.code).toBe('unauthenticated')
  })

  it('answers a write after the timeout with session_expired, not csrf, and changes nothing', async () => {
    const { user, a } = await signedIn()
    clockMs += 31 * MIN
    const res = await a.patch('/api/person/preferences', { emailNotices: false })
    expect(res.status).toBe(401)
    expect(res.body).toEqual(EXPIRED)
    await user.reload()
    expect(user.emailNotices).toBe(true)
  })

  it('lets the person sign in again right away', async () => {
    const { user, a } = await signedIn()
    clockMs += 31 * MIN
    expect((await a.get('/api/me')).status).toBe(401)
    const fresh = await agentWithCsrf(t.app)
    expect((await fresh.signIn(user.email, password)).status).toBe(200)
    expect((await fresh.get('/api/me')).status).toBe(200)
    expect(await rowsOf(user.id)).toBe(1)
  })
})

describe('absolute timeout (SESSION_ABSOLUTE_HOURS)', () => {
  it('ends a session 12 hours after sign-in even when it was used every 20 minutes', async () => {
    const { user, a } = await signedIn()
    for (let i = 0; i < 35; i++) {
      clockMs += 20 * MIN
      expect((await a.get('/api/me')).status).toBe(200)
    }
    clockMs += 21 * MIN // 12 h 1 min after sign-in, 21 min after the last request
    const res = await a.get('/api/me')
    expect(res.status).toBe(401)
    expect(res.body).toEqual(EXPIRED)
    expect(await rowsOf(user.id)).toBe(0)
  })
})

describe('session writes', () => {
  it('writes the session row at most once a minute however many requests come in', async () => {
    const { user, a } = await signedIn()
    const writes: string[] = []
    const options = (t.deps.sequelize as unknown as { options: { logging: unknown } }).options
    options.logging = (sql: string) => { if (/^Executing \(\w+\): (UPDATE|INSERT)[^;]*[`"]sessions[`"]/.test(sql)) writes.push(sql) }
    try {
      const row = async () => (await t.deps.models.Session.findOne({ where: { userId: user.id } }))!
      const first = await row()

      clockMs += 10_000
      expect((await a.get('/api/me')).status).toBe(200)
      clockMs += 20_000
      expect((await a.get('/api/person/links')).status).toBe(200)
      expect(writes).toHaveLength(0)
      const unchanged = await row()
      expect(unchanged.data).toBe(first.data)
      expect(unchanged.expires?.getTime()).toBe(first.expires?.getTime())

      clockMs += 40_000 // a minute and ten seconds after sign-in
      const res = await a.get('/api/me')
      expect(res.status).toBe(200)
      expect(sidCookie(res).cookie).toMatch(/^rungs\.sid=/) // the cookie is renewed with the row
      expect(writes).toHaveLength(1)
      const written = await row()
      expect(JSON.parse(written.data!).lastSeenAt).toBe(clockMs)
      expect(written.expires!.getTime()).toBeGreaterThan(first.expires!.getTime())

      clockMs += 5_000
      expect((await a.get('/api/me')).status).toBe(200)
      expect(writes).toHaveLength(1)
    } finally {
      options.logging = false
    }
  })
})
