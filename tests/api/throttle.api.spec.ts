import supertest from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { hashPassword } from '../../server/auth/password'
import { makeTestApp, type TestApp } from '../helpers/testApp'

let t: TestApp
// TRUST_PROXY makes X-Forwarded-For the client's address, so one test can sign in from many addresses.
beforeAll(async () => { t = await makeTestApp({ TRUST_PROXY: 'true', SIGNIN_LIMIT: '4', SIGNIN_ACCOUNT_LIMIT: '3' }) })
afterAll(async () => { await t.close() })

const password = 'gulls over the estuary at noon'
let n = 0
let ip = 0
const nextIp = () => `203.0.113.${++ip}` // RFC 5737 documentation range
async function makeUser() {
  return t.deps.models.User.create({
    email: `throttle-${++n}@example.test`, passwordHash: await hashPassword(password, t.deps.config.scryptCost), role: 'person', displayName: 'Odile', emailVerifiedAt: new Date(), disabledAt: null,
  })
}

/** A sign-in from one address, with its own cookie jar and CSRF token. */
async function signInFrom(from: string, email: string, pw: string) {
  const agent = supertest.agent(t.app)
  const csrf = await agent.get('/api/auth/csrf').set('X-Forwarded-For', from)
  return agent.post('/api/auth/signin').set('X-Forwarded-For', from).set('x-csrf-token', csrf.body.csrfToken).send({ email, password: pw })
}
const sessionsOf = (userId: string) => t.deps.models.Session.count({ where: { userId } })
const LIMITED = { error: { code: 'rate_limited', message: 'Too many attempts. Please wait a few minutes and try again.' } }

describe('sign-in throttled per account (SIGNIN_ACCOUNT_LIMIT)', () => {
  it('blocks an account after 3 failures from 3 different addresses, even with the right password from a 4th', async () => {
    const user = await makeUser()
    for (let i = 0; i < 3; i++) expect((await signInFrom(nextIp(), user.email, 'not the password')).status).toBe(401)
    const res = await signInFrom(nextIp(), user.email, password)
    expect(res.status).toBe(429)
    expect(res.body).toEqual(LIMITED)
    expect(await sessionsOf(user.id)).toBe(0)
  })

  it('counts one account whatever the case or spaces of the address', async () => {
    const user = await makeUser()
    const variants = [user.email.toUpperCase(), `  ${user.email}  `, user.email.replace('throttle', 'THROTTLE')]
    for (const v of variants) expect((await signInFrom(nextIp(), v, 'not the password')).status).toBe(401)
    expect((await signInFrom(nextIp(), user.email, password)).status).toBe(429)
    expect(await sessionsOf(user.id)).toBe(0)
  })

  it('answers a made-up address exactly like a real one, before and after the limit', async () => {
    const user = await makeUser()
    const madeUp = `nobody-${n}@example.test`
    for (let i = 0; i < 3; i++) {
      const real = await signInFrom(nextIp(), user.email, 'not the password')
      const fake = await signInFrom(nextIp(), madeUp, 'not the password')
      expect(fake.status).toBe(real.status)
      expect(fake.body).toEqual(real.body)
    }
    const real = await signInFrom(nextIp(), user.email, 'not the password')
    const fake = await signInFrom(nextIp(), madeUp, 'not the password')
    expect(real.status).toBe(429)
    expect(fake.status).toBe(429)
    expect(fake.body).toEqual(real.body)
    expect(await t.deps.models.User.count({ where: { email: madeUp } })).toBe(0)
  })

  it('does not count successful sign-ins, so a person signing in on many devices is never blocked', async () => {
    const user = await makeUser()
    for (let i = 0; i < 5; i++) expect((await signInFrom(nextIp(), user.email, password)).status).toBe(200)
    expect(await sessionsOf(user.id)).toBe(5)
  })

  it('leaves other accounts alone', async () => {
    const blocked = await makeUser()
    const other = await makeUser()
    for (let i = 0; i < 3; i++) await signInFrom(nextIp(), blocked.email, 'not the password')
    expect((await signInFrom(nextIp(), blocked.email, password)).status).toBe(429)
    expect((await signInFrom(nextIp(), other.email, password)).status).toBe(200)
    expect(await sessionsOf(other.id)).toBe(1)
  })
})

describe('sign-in throttled per IP (SIGNIN_LIMIT)', () => {
  it('blocks an address after 4 failures spread over 4 accounts, and a 5th account with the right password too', async () => {
    const from = nextIp()
    for (let i = 0; i < 4; i++) {
      const u = await makeUser()
      expect((await signInFrom(from, u.email, 'not the password')).status).toBe(401)
    }
    const target = await makeUser()
    const res = await signInFrom(from, target.email, password)
    expect(res.status).toBe(429)
    expect(res.body).toEqual(LIMITED)
    expect(await sessionsOf(target.id)).toBe(0)

    expect((await signInFrom(nextIp(), target.email, password)).status).toBe(200)
    expect(await sessionsOf(target.id)).toBe(1)
  })
})
