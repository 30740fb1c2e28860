import { describe, expect, it } from 'vitest'
import { hashPassword, verifyPassword } from '../../../server/auth/password'

// A low scrypt cost keeps the tests fast; production uses 2^15 (see password.ts).
const cost = 1024
const password = 'correct horse battery staple'

describe('hashPassword and verifyPassword', () => {
  it('verifies the password a hash was made from', async () => {
    const stored = await hashPassword(password, cost)
    expect(stored).toMatch(/^scrypt\$1024\$8\$3\$[A-Za-z0-9+/=]+\$[A-Za-z0-9+/=]+$/)
    expect(stored).not.toContain(password)
    expect(await verifyPassword(password, stored)).toBe(true)
  })

  it('rejects a wrong password', async () => {
    const stored = await hashPassword(password, cost)
    expect(await verifyPassword('correct horse battery stapler', stored)).toBe(false)
    expect(await verifyPassword('', stored)).toBe(false)
  })

  it('salts each hash, so two hashes of one password differ', async () => {
    const [a, b] = await Promise.all([hashPassword(password, cost), hashPassword(password, cost)])
    expect(a).not.toBe(b)
    expect(a.split('$')[4]).not.toBe(b.split('$')[4])
    expect(await verifyPassword(password, a)).toBe(true)
    expect(await verifyPassword(password, b)).toBe(true)
  })

  it('answers false for a malformed or damaged stored string', async () => {
    const [, n, r, p, salt, key] = (await hashPassword(password, cost)).split('$')
    const damaged = [
      '',
      'not a hash',
      `scrypt$${n}$${r}$${p}$${salt}`,
      `bcrypt$${n}$${r}$${p}$${salt}$${key}`,
      `scrypt$abc$${r}$${p}$${salt}$${key}`,
      `scrypt$3$${r}$${p}$${salt}$${key}`,
      // A key that decodes to nothing must not match every password.
      `scrypt$${n}$${r}$${p}$${salt}$!!!`,
    ]
    for (const stored of damaged) expect(await verifyPassword(password, stored), stored).toBe(false)
  })
})
