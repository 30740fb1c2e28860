import supertest from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { hashPassword, verifyPassword } from '../../server/auth/password'
import { demoAccounts } from '../../server/db/seed'
import { agentWithCsrf, linkIn, makeTestApp, type TestApp } from '../helpers/testApp'

let t: TestApp
// The limits are raised here because this file sends many more mail requests than a person would; the limits
// themselves are checked below against an app of their own.
beforeAll(async () => { t = await makeTestApp({ SIGNIN_LIMIT: '1000', RESET_LIMIT: '1000' }) })
afterAll(async () => { await t.close() })

const person = demoAccounts.person
const password = 'a long enough passphrase'
let n = 0
const newAddress = (label: string) => `auth-${label}-${++n}@example.test`

async function createUser(email: string, pw = password) {
  return t.deps.models.User.create({
    email, passwordHash: await hashPassword(pw, t.deps.config.scryptCost), role: 'person', displayName: 'Test Person', emailVerifiedAt: new Date(), disabledAt: null,
  })
}

const sessionsOf = (userId: string) => t.deps.models.Session.count({ where: { userId } })

/** The attributes of the rungs.sid Set-Cookie header, lower-cased. */
const sessionCookie = (res: { headers: Record<string, unknown> }) => {
  const cookies = (res.headers['set-cookie'] ?? []) as string[]
  const found = cookies.find((c) => c.startsWith('rungs.sid='))
  if (!found) throw new Error('no rungs.sid cookie was set')
  return found.split(';').map((part) => part.trim().toLowerCase())
}

describe('POST /api/auth/signup', () => {
  it('creates an unverified person and mails a link that confirms the address only once', async () => {
    const email = newAddress('person')
    const a = await agentWithCsrf(t.app)
    const res = await a.post('/api/auth/signup', { role: 'person', email, password, displayName: 'Sam' })
    expect(res.status).toBe(202)
    const user = await t.deps.models.User.findOne({ where: { email } })
    expect(user).toMatchObject({ role: 'person', displayName: 'Sam', emailVerifiedAt: null })
    expect(user!.passwordHash).toMatch(/^scrypt\$/)

    const mail = await t.deps.fakeSmtp.waitFor((m) => m.to.includes(email))
    expect(mail.subject).toBe('Confirm your e-mail address')
    const token = linkIn(mail.text, '/verify')
    expect((await a.post('/api/auth/verify', { token })).status).toBe(200)
    await user!.reload()
    expect(user!.emailVerifiedAt).toBeInstanceOf(Date)

    const again = await a.post('/api/auth/verify', { token })
    expect(again.status).toBe(400)
    expect(again.body.error.code).toBe('link_expired')
  })

  it('creates a therapist with a profile that waits for approval', async () => {
    const email = newAddress('therapist')
    const a = await agentWithCsrf(t.app)
    const res = await a.post('/api/auth/signup', { role: 'therapist', email, password, displayName: 'Dr Vale', practice: 'Vale Rooms', registration: 'Register no. 123' })
    expect(res.status).toBe(202)
    const user = await t.deps.models.User.findOne({ where: { email } })
    expect(user?.role).toBe('therapist')
    const profile = await t.deps.models.TherapistProfile.findOne({ where: { userId: user!.id } })
    expect(profile).toMatchObject({ practice: 'Vale Rooms', registration: 'Register no. 123', approvedAt: null, approvedById: null })
  })

  it('answers an address that already has an account exactly like a new one, and mails its owner instead', async () => {
    const existing = await t.deps.models.User.findOne({ where: { email: person.email } })
    const usersBefore = await t.deps.models.User.count()
    const a = await agentWithCsrf(t.app)

    const fresh = await a.post('/api/auth/signup', { role: 'person', email: newAddress('fresh'), password, displayName: 'New' })
    const taken = await a.post('/api/auth/signup', { role: 'person', email: person.email.toUpperCase(), password: 'another passphrase', displayName: 'Intruder' })
    expect(taken.status).toBe(fresh.status)
    expect(taken.body).toEqual(fresh.body)

    expect(await t.deps.models.User.count()).toBe(usersBefore + 1)
    expect(await t.deps.models.User.count({ where: { email: person.email } })).toBe(1)
    const after = await t.deps.models.User.findByPk(existing!.id)
    expect(after!.passwordHash).toBe(existing!.passwordHash)
    expect(after!.displayName).toBe(existing!.displayName)

    const mail = await t.deps.fakeSmtp.waitFor((m) => m.to.includes(person.email) && m.subject === 'About your Rungs account')
    expect(mail.text).toContain('already has one')
    expect(mail.text).not.toContain('/verify?token=')
  })
})

describe('POST /api/auth/signin and /api/auth/signout', () => {
  it('signs in with the right password and returns the user and a session', async () => {
    const user = await t.deps.models.User.findOne({ where: { email: person.email } })
    const before = await sessionsOf(user!.id)
    const a = await agentWithCsrf(t.app)
    const res = await a.signIn(person.email, person.password)
    expect(res.status).toBe(200)
    expect(res.body.user).toMatchObject({ id: user!.id, email: person.email, role: 'person' })
    expect(res.body.csrfToken).toEqual(expect.any(String))
    expect(await sessionsOf(user!.id)).toBe(before + 1)
  })

  it('answers a wrong password and an unknown address with the same 401 and body', async () => {
    const a = await agentWithCsrf(t.app)
    const wrong = await a.signIn(person.email, 'not the password')
    const unknown = await a.signIn(newAddress('nobody'), 'not the password')
    expect(wrong.status).toBe(401)
    expect(unknown.status).toBe(401)
    expect(unknown.body).toEqual(wrong.body)
    expect(wrong.body.error.code).toBe('bad_credentials')
    expect((await a.get('/api/me')).status).toBe(401)
  })

  it('signs out, removes the session row, and /api/me answers 401 again', async () => {
    const user = await createUser(newAddress('signout'))
    const a = await agentWithCsrf(t.app)
    await a.signIn(user.email, password)
    expect((await a.get('/api/me')).status).toBe(200)
    expect(await sessionsOf(user.id)).toBe(1)

    expect((await a.signOut()).status).toBe(200)
    expect(await sessionsOf(user.id)).toBe(0)
    const me = await a.get('/api/me')
    expect(me.status).toBe(401)
    expect(me.body.error.code).toBe('unauthenticated')
  })

  it('rejects the CSRF token from before sign-in with 403 csrf once signed in', async () => {
    const a = await agentWithCsrf(t.app)
    const old = a.token
    await a.signIn(person.email, person.password)
    expect(a.token).not.toBe(old)

    const stale = await a.agent.patch('/api/person/preferences').set('x-csrf-token', old).send({ emailNotices: false })
    expect(stale.status).toBe(403)
    expect(stale.body.error.code).toBe('csrf')
    expect((await t.deps.models.User.findOne({ where: { email: person.email } }))!.emailNotices).toBe(true)
    expect((await a.patch('/api/person/preferences', { emailNotices: true })).status).toBe(200)
  })
})

describe('the session cookie', () => {
  it('is HttpOnly and SameSite=Lax, and not Secure over plain http', async () => {
    const attrs = sessionCookie(await supertest(t.app).get('/api/auth/csrf'))
    expect(attrs).toContain('httponly')
    expect(attrs).toContain('samesite=lax')
    expect(attrs).not.toContain('secure')
  })

  it('ignores X-Forwarded-Proto when no proxy is trusted', async () => {
    const attrs = sessionCookie(await supertest(t.app).get('/api/auth/csrf').set('X-Forwarded-Proto', 'https'))
    expect(attrs).not.toContain('secure')
  })
})

describe('CSRF protection', () => {
  it.each([
    ['sign-in', '/api/auth/signin', { email: person.email, password: person.password }],
    ['sign-up', '/api/auth/signup', { role: 'person', email: 'auth-csrf-signup@example.test', password, displayName: 'X' }],
  ])('returns 403 csrf for a %s POST without a token or with a wrong one', async (_name, url, body) => {
    const a = await agentWithCsrf(t.app)
    for (const token of [undefined, 'wrong-token']) {
      const req = a.agent.post(url)
      const res = await (token ? req.set('x-csrf-token', token) : req).send(body)
      expect(res.status).toBe(403)
      expect(res.body).toEqual({ error: { code: 'csrf', message: expect.any(String) } })
    }
    expect((await a.get('/api/me')).status).toBe(401)
    expect(await t.deps.models.User.count({ where: { email: 'auth-csrf-signup@example.test' } })).toBe(0)
  })

  it('returns 403 csrf for an admin PATCH without a token or with a wrong one, and changes nothing', async () => {
    const target = await createUser(newAddress('csrf-target'))
    const a = await agentWithCsrf(t.app)
    await a.signIn(demoAccounts.admin.email, demoAccounts.admin.password)
    for (const token of [undefined, 'wrong-token']) {
      const req = a.agent.patch(`/api/admin/accounts/${target.id}`)
      const res = await (token ? req.set('x-csrf-token', token) : req).send({ disabled: true })
      expect(res.status).toBe(403)
      expect(res.body.error.code).toBe('csrf')
    }
    await target.reload()
    expect(target.disabledAt).toBeNull()
  })
})

describe('password reset', () => {
  async function resetTokenFor(email: string) {
    const a = await agentWithCsrf(t.app)
    expect((await a.post('/api/auth/reset/request', { email })).status).toBe(202)
    const mail = await t.deps.fakeSmtp.waitFor((m) => m.to.includes(email) && m.subject === 'Choose a new password')
    return { a, token: linkIn(mail.text, '/reset') }
  }

  it('answers a known and an unknown address the same, and mails only the known one', async () => {
    const known = await createUser(newAddress('reset-known'))
    const unknown = newAddress('reset-unknown')
    const a = await agentWithCsrf(t.app)
    const k = await a.post('/api/auth/reset/request', { email: known.email })
    const u = await a.post('/api/auth/reset/request', { email: unknown })
    expect(k.status).toBe(202)
    expect(u.status).toBe(202)
    expect(u.body).toEqual(k.body)

    await t.deps.fakeSmtp.waitFor((m) => m.to.includes(known.email))
    expect(t.deps.fakeSmtp.messages().some((m) => m.to.includes(unknown))).toBe(false)
    expect(await t.deps.models.EmailToken.count({ where: { userId: known.id, purpose: 'reset' } })).toBe(1)
    expect(await t.deps.models.User.count({ where: { email: unknown } })).toBe(0)
  })

  it('sets the new password through the mailed link once and signs the account out everywhere', async () => {
    const user = await createUser(newAddress('reset'))
    const phone = await agentWithCsrf(t.app)
    const laptop = await agentWithCsrf(t.app)
    await phone.signIn(user.email, password)
    await laptop.signIn(user.email, password)
    expect(await sessionsOf(user.id)).toBe(2)

    const { a, token } = await resetTokenFor(user.email)
    const newPassword = 'a different passphrase'
    expect((await a.post('/api/auth/reset', { token, password: newPassword })).status).toBe(200)
    await user.reload()
    expect(await verifyPassword(newPassword, user.passwordHash)).toBe(true)
    expect(await sessionsOf(user.id)).toBe(0)
    expect((await phone.get('/api/me')).status).toBe(401)
    expect((await laptop.get('/api/me')).status).toBe(401)

    expect((await a.signIn(user.email, password)).status).toBe(401)
    expect((await a.signIn(user.email, newPassword)).status).toBe(200)

    const reused = await a.post('/api/auth/reset', { token, password: 'yet another passphrase' })
    expect(reused.status).toBe(400)
    expect(reused.body.error.code).toBe('link_expired')
    const hashAfterFirstReset = user.passwordHash
    await user.reload()
    expect(user.passwordHash).toBe(hashAfterFirstReset)
  })

  it('refuses a link whose token has expired and keeps the old password', async () => {
    const user = await createUser(newAddress('reset-expired'))
    const { a, token } = await resetTokenFor(user.email)
    await t.deps.models.EmailToken.update({ expiresAt: new Date(Date.now() - 1000) }, { where: { userId: user.id, purpose: 'reset' } })

    const res = await a.post('/api/auth/reset', { token, password: 'a different passphrase' })
    expect(res.status).toBe(400)
    expect(res.body.error.code).toBe('link_expired')
    const hashBefore = user.passwordHash
    await user.reload()
    expect(user.passwordHash).toBe(hashBefore)
    expect((await a.signIn(user.email, password)).status).toBe(200)
  })
})

describe('validation and unknown routes', () => {
  const detailPaths = (body: { error: { details: { path: string[] }[] } }) => body.error.details.map((d) => d.path.join('.'))

  it('returns 400 invalid_input with details for a bad e-mail address', async () => {
    const a = await agentWithCsrf(t.app)
    const res = await a.post('/api/auth/signup', { role: 'person', email: 'not-an-address', password, displayName: 'X' })
    expect(res.status).toBe(400)
    expect(res.body.error.code).toBe('invalid_input')
    expect(detailPaths(res.body)).toEqual(['body.email'])
    expect(await t.deps.models.User.count({ where: { email: 'not-an-address' } })).toBe(0)
  })

  it('returns 400 invalid_input for a 7-character password', async () => {
    const email = newAddress('short')
    const a = await agentWithCsrf(t.app)
    const res = await a.post('/api/auth/signup', { role: 'person', email, password: '7chars!', displayName: 'X' })
    expect(res.status).toBe(400)
    expect(res.body.error.code).toBe('invalid_input')
    expect(detailPaths(res.body)).toEqual(['body.password'])
    expect(await t.deps.models.User.count({ where: { email } })).toBe(0)
  })

  it('returns 400 invalid_input naming each missing field', async () => {
    const a = await agentWithCsrf(t.app)
    const res = await a.post('/api/auth/signin', {})
    expect(res.status).toBe(400)
    expect(res.body.error.code).toBe('invalid_input')
    expect(detailPaths(res.body).sort()).toEqual(['body.email', 'body.password'])
  })

  it('returns 400 bad_json for a malformed JSON body', async () => {
    const a = await agentWithCsrf(t.app)
    const res = await a.agent.post('/api/auth/signin').set('x-csrf-token', a.token).set('Content-Type', 'application/json').send('{"email":')
    expect(res.status).toBe(400)
    expect(res.body).toEqual({ error: { code: 'bad_json', message: expect.any(String) } })
  })

  it('returns 404 in the error shape for an unknown API path', async () => {
    const res = await supertest(t.app).get('/api/whatever')
    expect(res.status).toBe(404)
    expect(res.headers['content-type']).toMatch(/application\/json/)
    expect(res.body).toEqual({ error: { code: 'not_found', message: expect.any(String) } })
  })
})

describe('a disabled account', () => {
  it('loses access on the very next request and cannot sign in again', async () => {
    const user = await createUser(newAddress('disabled'))
    const a = await agentWithCsrf(t.app)
    await a.signIn(user.email, password)
    expect((await a.get('/api/me')).status).toBe(200)

    await user.update({ disabledAt: new Date() })
    const me = await a.get('/api/me')
    expect(me.status).toBe(401)
    expect(me.body.error.code).toBe('unauthenticated')
    const again = await a.signIn(user.email, password)
    expect(again.status).toBe(401)
    expect(again.body.error.code).toBe('bad_credentials')
  })
})

// These need settings of their own, so they run last: the model classes are process-wide and follow the most
// recently opened database, which would leave the main app above pointing at a closed one.
describe('settings that need an app of their own', () => {
  it('marks the session cookie Secure when a trusted proxy reports https', async () => {
    const proxied = await makeTestApp({ TRUST_PROXY: 'true' })
    try {
      const attrs = sessionCookie(await supertest(proxied.app).get('/api/auth/csrf').set('X-Forwarded-Proto', 'https'))
      expect(attrs).toContain('secure')
      expect(attrs).toContain('httponly')
      expect(attrs).toContain('samesite=lax')
    } finally {
      await proxied.close()
    }
  })

  describe('rate limits', () => {
    let limited: TestApp
    beforeAll(async () => { limited = await makeTestApp({ SIGNIN_LIMIT: '3', RESET_LIMIT: '2' }) })
    afterAll(async () => { await limited.close() })

    it('does not count successful sign-ins, so people sharing an address are not locked out', async () => {
      for (let i = 0; i < 4; i++) {
        const a = await agentWithCsrf(limited.app)
        expect((await a.signIn(person.email, person.password)).status).toBe(200)
      }
      const user = await limited.deps.models.User.findOne({ where: { email: person.email } })
      expect(await limited.deps.models.Session.count({ where: { userId: user!.id } })).toBe(4)
      await limited.deps.models.Session.destroy({ where: { userId: user!.id } })
    })

    it('answers the 4th failed sign-in attempt in the window with 429, even with the right password', async () => {
      const a = await agentWithCsrf(limited.app)
      for (let i = 0; i < 3; i++) expect((await a.signIn(person.email, 'not the password')).status).toBe(401)
      const fourth = await a.signIn(person.email, person.password)
      expect(fourth.status).toBe(429)
      expect(fourth.body.error.code).toBe('rate_limited')
      const user = await limited.deps.models.User.findOne({ where: { email: person.email } })
      expect(await limited.deps.models.Session.count({ where: { userId: user!.id } })).toBe(0)
    })

    it('answers a throttled sign-in for a made-up address exactly like one for a real account', async () => {
      const a = await agentWithCsrf(limited.app)
      const real = await a.signIn(person.email, person.password)
      const madeUp = await a.signIn('auth-nobody-throttled@example.test', 'not the password')
      expect(real.status).toBe(429)
      expect(madeUp.status).toBe(429)
      expect(madeUp.body).toEqual(real.body)
      expect(await limited.deps.models.User.count({ where: { email: 'auth-nobody-throttled@example.test' } })).toBe(0)
    })

    it('answers a reset request over RESET_LIMIT with 429 and issues no token for it', async () => {
      const a = await agentWithCsrf(limited.app)
      for (let i = 0; i < 2; i++) expect((await a.post('/api/auth/reset/request', { email: person.email })).status).toBe(202)
      const third = await a.post('/api/auth/reset/request', { email: person.email })
      expect(third.status).toBe(429)
      expect(third.body.error.code).toBe('rate_limited')
      const user = await limited.deps.models.User.findOne({ where: { email: person.email } })
      expect(await limited.deps.models.EmailToken.count({ where: { userId: user!.id, purpose: 'reset' } })).toBe(2)
    })
  })
})
