import type { LockIdleMinutes } from '@shared/schemas/appLock.schema'
import { dbNow, openDb } from './openDb'
import type { AppLockRecord } from './RungsDB'
import { readSetting, writeSetting } from './settingsRepository'
import { writeStartupHint } from './startupHints'

// OWASP Password Storage Cheat Sheet's advice for PBKDF2-HMAC-SHA256, from memory (the same as backups).
export const LOCK_ITERATIONS = 600_000
const SALT_BYTES = 16

async function derive(passcode: string, salt: Uint8Array<ArrayBuffer>, iterations: number): Promise<Uint8Array> {
  const subtle = globalThis.crypto?.subtle
  if (!subtle) throw new Error('This browser cannot check a passcode (Web Crypto is missing).')
  const base = await subtle.importKey('raw', new TextEncoder().encode(passcode.normalize('NFC')), 'PBKDF2', false, ['deriveBits'])
  return new Uint8Array(await subtle.deriveBits({ name: 'PBKDF2', hash: 'SHA-256', salt, iterations }, base, 256))
}

function sameBytes(a: Uint8Array, b: Uint8Array): boolean {
  if (a.length !== b.length) return false
  let diff = 0
  for (let i = 0; i < a.length; i++) diff |= a[i]! ^ b[i]!
  return diff === 0
}

// The base64 helpers live with the backup code (and its zod schemas), which only setting or checking a passcode needs.
const backupCrypto = () => import('@/backup/backupCrypto')

/** The lock record; each read also mirrors "a lock is set" into the start-up hint (db/startupHints.ts). */
export async function readAppLock(): Promise<AppLockRecord | undefined> {
  const record = await readSetting('appLock')
  writeStartupHint('lockSet', Boolean(record))
  return record
}

/**
 * Turns the lock on (or changes the passcode): stores a PBKDF2-SHA-256 hash with a fresh random salt, never the passcode.
 * Tests may pass fewer iterations to stay fast; the app always uses the default.
 */
export async function setAppLock(passcode: string, idleMinutes: LockIdleMinutes, iterations = LOCK_ITERATIONS, now = Date.now()): Promise<AppLockRecord> {
  const db = dbNow() ?? (await openDb())
  const { bytesToBase64 } = await backupCrypto()
  const salt = globalThis.crypto.getRandomValues(new Uint8Array(SALT_BYTES))
  const hash = await derive(passcode, salt, iterations)
  const record: AppLockRecord = { hash: bytesToBase64(hash), salt: bytesToBase64(salt), iterations, digits: /^\d+$/.test(passcode), idleMinutes, setAt: now }
  // Mirrored before the write: if the write fails, the hint errs towards asking Dexie at the next start, never the other way.
  writeStartupHint('lockSet', true)
  await db.transaction('rw', db.settings, async () => {
    await writeSetting('appLock', record)
    await db.settings.delete('appLockFailures')
  })
  return record
}

export async function setLockIdle(idleMinutes: LockIdleMinutes): Promise<void> {
  const record = await readAppLock()
  if (record) await writeSetting('appLock', { ...record, idleMinutes })
}

export async function removeAppLock(): Promise<void> {
  const db = dbNow() ?? (await openDb())
  await db.settings.bulkDelete(['appLock', 'appLockFailures'])
  // Cleared only once the lock is gone from Dexie.
  writeStartupHint('lockSet', false)
}

/** Whether the passcode matches the stored hash. No lock set means nothing to match. */
export async function checkPasscode(passcode: string): Promise<boolean> {
  const record = await readAppLock()
  if (!record) return false
  const { base64ToBytes } = await backupCrypto()
  const hash = await derive(passcode, base64ToBytes(record.salt), record.iterations)
  return sameBytes(hash, base64ToBytes(record.hash))
}

export async function readLockFailures(): Promise<{ count: number; lastAt: number }> {
  return (await readSetting('appLockFailures')) ?? { count: 0, lastAt: 0 }
}

export async function recordLockFailure(now = Date.now()): Promise<{ count: number; lastAt: number }> {
  const next = { count: (await readLockFailures()).count + 1, lastAt: now }
  await writeSetting('appLockFailures', next)
  return next
}

export async function clearLockFailures(): Promise<void> {
  const db = dbNow() ?? (await openDb())
  await db.settings.delete('appLockFailures')
}
