import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { hashPassword, verifyPassword } from '../../server/auth/password'
import { demoAccounts } from '../../server/db/seed'
import { agentWithCsrf, linkIn, makeTestApp, type TestApp } from '../helpers/testApp'

let t: TestApp
beforeAll(async () => { t = await makeTestApp({ SIGNIN_LIMIT: '1000', RESET_LIMIT: '1000' }) })
afterAll(async () => { await t.close() })

let n = 0
const newAddress = (label: string) => `pw-${label}-${++n}@example.test`
const TOO_COMMON = 'That password is too common; choose one that is harder to guess.'

async function signUp(email: string, password: string, displayName = 'Wren') {
  const a = await agentWithCsrf(t.app)
  return a.post('/api/auth/signup', { role: 'person', email, password, displayName })
}
const accountCount = (email: string) => t.deps.models.User.count({ where: { email } })

describe('password length (NIST SP 800-63B 5.1.1.2: at least 8 characters)', () => {
  it('counts Unicode code points, so four emoji (eight UTF-16 units) are too short', async () => {
    const email = newAddress('emoji4')
    expect('🌧🌧🍂🍂'.length).toBe(8)
    const res = await signUp(email, '🌧🌧🍂🍂')
    expect(res.status).toBe(400)
    expect(res.body.error.code).toBe('invalid_input')
    expect(res.body.error.details[0].message).toBe('Use at least 8 characters.')
    expect(await accountCount(email)).toBe(0)
  })

  it('accepts eight emoji, and 256 code points, and refuses 257', async () => {
    const eight = newAddress('emoji8')
    expect((await signUp(eight, '🌧🍂🌧🍂🌧🍂🌧🍂')).status).toBe(202)
    expect(await accountCount(eight)).toBe(1)

    const longest = newAddress('cp256')
    expect((await signUp(longest, '🍂'.repeat(256))).status).toBe(202)
    const user = await t.deps.models.User.findOne({ where: { email: longest } })
    expect(await verifyPassword('🍂'.repeat(256), user!.passwordHash)).toBe(true)

    const tooLong = newAddress('cp257')
    const res = await signUp(tooLong, '🍂'.repeat(257))
    expect(res.status).toBe(400)
    expect(res.body.error.details[0].message).toBe('Use at most 256 characters.')
    expect(await accountCount(tooLong)).toBe(0)
  })

  it('has no composition rules: a long lower-case passphrase with spaces is accepted', async () => {
    const email = newAddress('passphrase')
    const passphrase = 'cobalt kettles hum under the tidewater bridge'
    expect((await signUp(email, passphrase)).status).toBe(202)
    const user = await t.deps.models.User.findOne({ where: { email } })
    expect(await verifyPassword(passphrase, user!.passwordHash)).toBe(true)
  })
})

describe('common passwords on sign-up', () => {
  it.each(['password', 'PassWord', 'ILOVEYOU', 'sunshine', '12345678', 'Trustno1'])('refuses %s, in any case, with a clear message', async (pw) => {
    const email = newAddress('common')
    const res = await signUp(email, pw)
    expect(res.status).toBe(400)
    expect(res.body.error).toEqual({ code: 'password_too_common', message: TOO_COMMON, details: [{ path: ['body', 'password'], message: TOO_COMMON }] })
    expect(await accountCount(email)).toBe(0)
  })

  it('answers a common password for an address that has an account exactly as for a new one, and mails nobody', async () => {
    const before = t.deps.fakeSmtp.messages().length
    const taken = await signUp(demoAccounts.person.email, 'football', 'Intruder')
    const fresh = await signUp(newAddress('fresh-common'), 'football', 'Intruder')
    expect(taken.status).toBe(400)
    expect(taken.status).toBe(fresh.status)
    expect(taken.body).toEqual(fresh.body)
    expect(await accountCount(demoAccounts.person.email)).toBe(1)
    const user = await t.deps.models.User.findOne({ where: { email: demoAccounts.person.email } })
    expect(user!.displayName).toBe(demoAccounts.person.displayName)
    // Sign-up mail goes out in the background; give it a moment to show if it were (wrongly) sent.
    await new Promise((r) => setTimeout(r, 200))
    expect(t.deps.fakeSmtp.messages().length).toBe(before)
  })
})

describe('context-specific passwords (NIST SP 800-63B 5.1.1.2)', () => {
  it('refuses the e-mail address itself, in any case, and the part before the @', async () => {
    const email = newAddress('selfmail')
    for (const pw of [email, email.toUpperCase(), email.split('@')[0]!]) {
      const res = await signUp(email, pw)
      expect(res.status).toBe(400)
      expect(res.body.error.code).toBe('password_is_name')
      expect(res.body.error.message).toBe('Choose a password that is not your e-mail address or your name.')
    }
    expect(await accountCount(email)).toBe(0)
  })

  it('refuses the display name as the password', async () => {
    const email = newAddress('selfname')
    const res = await signUp(email, 'marigold fenwick', 'Marigold Fenwick')
    expect(res.status).toBe(400)
    expect(res.body.error.code).toBe('password_is_name')
    expect(await accountCount(email)).toBe(0)
  })
})

describe('password reset checks the new password too', () => {
  async function resetToken(email: string) {
    const a = await agentWithCsrf(t.app)
    expect((await a.post('/api/auth/reset/request', { email })).status).toBe(202)
    const mail = await t.deps.fakeSmtp.waitFor((m) => m.to.includes(email) && m.subject === 'Choose a new password')
    return { a, token: linkIn(mail.text, '/reset') }
  }

  it('refuses a common password and the own address, keeps the old password, and the link still works for a good one', async () => {
    const email = newAddress('reset')
    const oldPassword = 'lanterns over the quiet weir'
    const user = await t.deps.models.User.create({
      email, passwordHash: await hashPassword(oldPassword, t.deps.config.scryptCost), role: 'person', displayName: 'Ines', emailVerifiedAt: new Date(), disabledAt: null,
    })
    const { a, token } = await resetToken(email)

    const common = await a.post('/api/auth/reset', { token, password: 'Iloveyou' })
    expect(common.status).toBe(400)
    expect(common.body.error).toMatchObject({ code: 'password_too_common', message: TOO_COMMON })
    const own = await a.post('/api/auth/reset', { token, password: email })
    expect(own.status).toBe(400)
    expect(own.body.error.code).toBe('password_is_name')
    const short = await a.post('/api/auth/reset', { token, password: '🍂🍂🍂🍂' })
    expect(short.status).toBe(400)
    expect(short.body.error.code).toBe('invalid_input')

    await user.reload()
    expect(await verifyPassword(oldPassword, user.passwordHash)).toBe(true)
    expect(await t.deps.models.EmailToken.count({ where: { userId: user.id, purpose: 'reset', usedAt: null } })).toBe(1)

    const good = await a.post('/api/auth/reset', { token, password: 'herons wait by the cold mill race' })
    expect(good.status).toBe(200)
    await user.reload()
    expect(await verifyPassword('herons wait by the cold mill race', user.passwordHash)).toBe(true)
    expect(await t.deps.models.EmailToken.count({ where: { userId: user.id, purpose: 'reset', usedAt: null } })).toBe(0)
  })
})

describe('password hashes', () => {
  it('are scrypt with N from the test config, r = 8, p = 3, a 16-byte salt and a 64-byte key', async () => {
    const email = newAddress('hash')
    expect((await signUp(email, 'moss grows on the north gate')).status).toBe(202)
    const user = await t.deps.models.User.findOne({ where: { email } })
    const [scheme, cost, r, p, salt, key] = user!.passwordHash.split('$')
    expect([scheme, cost, r, p]).toEqual(['scrypt', '1024', '8', '3'])
    expect(Buffer.from(salt!, 'base64')).toHaveLength(16)
    expect(Buffer.from(key!, 'base64')).toHaveLength(64)
  })
})
