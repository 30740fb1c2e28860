import { randomBytes, scrypt as scryptCb, timingSafeEqual, type ScryptOptions } from 'node:crypto'

function scrypt(password: string, salt: Buffer, keylen: number, options: ScryptOptions): Promise<Buffer> {
  return new Promise((resolve, reject) => scryptCb(password, salt, keylen, options, (err, key) => (err ? reject(err) : resolve(key))))
}

/** 64-byte key and 16-byte random salt per hash (OWASP Password Storage Cheat Sheet: a unique salt per password). */
const KEYLEN = 64
const SALT_BYTES = 16
/** Block size and parallelisation for new hashes; N comes from config (SCRYPT_COST, default 2^15 = 32 MiB at r = 8). */
const R = 8
const P = 3

/**
 * Hashes with scrypt (RFC 7914). Stored as `scrypt$N$r$p$salt$hash`, so the cost can rise later without breaking old
 * hashes: verifying reads the parameters from the stored string.
 * The OWASP Password Storage Cheat Sheet (2023) asks for at least N = 2^17, r = 8, p = 1 and lists N = 2^15, r = 8,
 * p = 3 as equally strong (the equivalence table from memory); Rungs uses the latter, which needs 32 MiB instead of
 * 128 MiB per sign-in. Tests lower N through SCRYPT_COST.
 */
export async function hashPassword(password: string, cost: number): Promise<string> {
  const salt = randomBytes(SALT_BYTES)
  const key = await scrypt(password, salt, KEYLEN, { N: cost, r: R, p: P, maxmem: 256 * cost * R })
  return `scrypt$${cost}$${R}$${P}$${salt.toString('base64')}$${key.toString('base64')}`
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
