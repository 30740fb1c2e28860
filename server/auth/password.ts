import { randomBytes, scrypt as scryptCb, timingSafeEqual, type ScryptOptions } from 'node:crypto'

function scrypt(password: string, salt: Buffer, keylen: number, options: ScryptOptions): Promise<Buffer> {
  return new Promise((resolve, reject) => scryptCb(password, salt, keylen, options, (err, key) => (err ? reject(err) : resolve(key))))
}

const KEYLEN = 64

/**
 * Hashes with scrypt (RFC 7914). Stored as `scrypt$N$r$p$salt$hash` so the cost can rise later without breaking old hashes.
 * N = 2^15, r = 8, p = 1 is the OWASP Password Storage Cheat Sheet's minimum; tests lower N through SCRYPT_COST.
 */
export async function hashPassword(password: string, cost: number): Promise<string> {
  const salt = randomBytes(16)
  const key = await scrypt(password, salt, KEYLEN, { N: cost, r: 8, p: 1, maxmem: 256 * cost * 8 })
  return `scrypt$${cost}$8$1$${salt.toString('base64')}$${key.toString('base64')}`
}

export async function verifyPassword(password: string, stored: string): Promise<boolean> {
  const [scheme, n, r, p, saltB64, keyB64] = stored.split('$')
  if (scheme !== 'scrypt' || !n || !r || !p || !saltB64 || !keyB64) return false
  const N = Number(n), R = Number(r), P = Number(p)
  const expected = Buffer.from(keyB64, 'base64')
  // A damaged key decodes short or empty, and an empty key would match every password.
  if (expected.length < 32) return false
  const key = await scrypt(password, Buffer.from(saltB64, 'base64'), expected.length, { N, r: R, p: P, maxmem: 256 * N * R }).catch(() => undefined)
  return key ? timingSafeEqual(key, expected) : false
}
