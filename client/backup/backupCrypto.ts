import {
  BACKUP_FORMAT,
  BACKUP_FORMAT_VERSION,
  backupPayloadSchema,
  type BackupPayload,
  type LockedBackupFile,
} from '@shared/schemas/backup.schema'

export type BackupErrorCode =
  | 'not_json'
  | 'not_rungs_backup'
  | 'newer_version'
  | 'too_large'
  | 'damaged'
  | 'wrong_passphrase'
  | 'passphrase_needed'
  | 'passphrase_too_short'

/** Anything that stops a backup being made or read. `message` is a plain sentence for the person. */
export class BackupError extends Error {
  constructor(
    readonly code: BackupErrorCode,
    message: string,
  ) {
    super(message)
    this.name = 'BackupError'
  }
}

// OWASP Password Storage Cheat Sheet's current advice for PBKDF2-HMAC-SHA256, from memory.
export const BACKUP_ITERATIONS = 600_000
/** Fewer than this, or more than the maximum, is not what any Rungs writes: the file is treated as damaged. */
export const MIN_BACKUP_ITERATIONS = 100_000
export const MAX_BACKUP_ITERATIONS = 10_000_000
const SALT_BYTES = 16
// 96-bit nonce, the length AES-GCM is specified for (NIST SP 800-38D).
const IV_BYTES = 12
const GCM_TAG_BYTES = 16
const CHECK_BYTES = 32
const KEY_INFO = `${BACKUP_FORMAT} aes-gcm key`
const CHECK_INFO = `${BACKUP_FORMAT} passphrase check`

const damaged = (detail: string) => new BackupError('damaged', `This file is damaged, so it cannot be restored: ${detail}.`)

function subtle(): SubtleCrypto {
  const s = globalThis.crypto?.subtle
  if (!s) throw new Error('This browser cannot lock or unlock backup files (Web Crypto is missing).')
  return s
}

/** Standard base64, chunked so that large files do not overflow the argument list. */
export function bytesToBase64(bytes: Uint8Array): string {
  let binary = ''
  const chunk = 0x8000
  for (let i = 0; i < bytes.length; i += chunk) binary += String.fromCharCode(...bytes.subarray(i, i + chunk))
  return btoa(binary)
}

export function base64ToBytes(text: string): Uint8Array<ArrayBuffer> {
  let binary: string
  try {
    binary = atob(text)
  } catch {
    throw damaged('its encoding is broken')
  }
  const bytes = new Uint8Array(binary.length)
  for (let i = 0; i < binary.length; i++) bytes[i] = binary.charCodeAt(i)
  return bytes
}

interface BackupKeys {
  key: CryptoKey
  check: Uint8Array
}

/**
 * One PBKDF2 run makes a master secret; HKDF splits it into the AES key and a separate check value, so the file can say
 * "wrong passphrase" (check differs) apart from "damaged" (check matches, decryption fails) without a second PBKDF2 run.
 */
async function deriveKeys(passphrase: string, salt: Uint8Array<ArrayBuffer>, iterations: number): Promise<BackupKeys> {
  const s = subtle()
  // NFC, so the same passphrase typed on another keyboard (composed or decomposed accents) still opens the file.
  const secret = new TextEncoder().encode(passphrase.normalize('NFC'))
  const base = await s.importKey('raw', secret, 'PBKDF2', false, ['deriveBits'])
  const master = await s.deriveBits({ name: 'PBKDF2', hash: 'SHA-256', salt, iterations }, base, 256)
  const hkdf = await s.importKey('raw', master, 'HKDF', false, ['deriveKey', 'deriveBits'])
  const hkdfParams = (info: string) => ({ name: 'HKDF', hash: 'SHA-256', salt: new Uint8Array(0), info: new TextEncoder().encode(info) })
  const key = await s.deriveKey(hkdfParams(KEY_INFO), hkdf, { name: 'AES-GCM', length: 256 }, false, ['encrypt', 'decrypt'])
  const check = new Uint8Array(await s.deriveBits(hkdfParams(CHECK_INFO), hkdf, CHECK_BYTES * 8))
  return { key, check }
}

function sameBytes(a: Uint8Array, b: Uint8Array): boolean {
  if (a.length !== b.length) return false
  let diff = 0
  for (let i = 0; i < a.length; i++) diff |= a[i]! ^ b[i]!
  return diff === 0
}

/**
 * Encrypts a backup payload with a key made from the passphrase (PBKDF2-SHA-256, then AES-GCM 256 with a fresh random
 * salt and iv). Tests may pass fewer iterations to stay fast; the app always uses the default.
 */
export async function lockBackup(payload: BackupPayload, passphrase: string, iterations = BACKUP_ITERATIONS): Promise<LockedBackupFile> {
  const salt = globalThis.crypto.getRandomValues(new Uint8Array(SALT_BYTES))
  const iv = globalThis.crypto.getRandomValues(new Uint8Array(IV_BYTES))
  const { key, check } = await deriveKeys(passphrase, salt, iterations)
  const plain = new TextEncoder().encode(JSON.stringify(backupPayloadSchema.parse(payload)))
  const data = new Uint8Array(await subtle().encrypt({ name: 'AES-GCM', iv }, key, plain))
  return {
    format: BACKUP_FORMAT,
    formatVersion: BACKUP_FORMAT_VERSION,
    locked: true,
    kdf: { name: 'PBKDF2', hash: 'SHA-256', iterations, salt: bytesToBase64(salt), check: bytesToBase64(check) },
    cipher: { name: 'AES-GCM', iv: bytesToBase64(iv) },
    data: bytesToBase64(data),
  }
}

export interface UnlockOptions {
  /** The fewest iterations accepted. Only tests lower it, to keep fast files readable. */
  minIterations?: number
}

/**
 * Decrypts a locked backup. Throws BackupError 'wrong_passphrase' when the passphrase does not match, and 'damaged'
 * when the file's numbers are out of range or its contents were changed after it was made.
 */
export async function unlockBackup(file: LockedBackupFile, passphrase: string, options: UnlockOptions = {}): Promise<BackupPayload> {
  const { iterations } = file.kdf
  if (iterations < (options.minIterations ?? MIN_BACKUP_ITERATIONS) || iterations > MAX_BACKUP_ITERATIONS) {
    throw damaged('its key settings are out of range')
  }
  const salt = base64ToBytes(file.kdf.salt)
  const iv = base64ToBytes(file.cipher.iv)
  const storedCheck = base64ToBytes(file.kdf.check)
  const data = base64ToBytes(file.data)
  if (salt.length < SALT_BYTES || iv.length !== IV_BYTES || storedCheck.length !== CHECK_BYTES || data.length < GCM_TAG_BYTES) {
    throw damaged('a part of it is missing')
  }

  const { key, check } = await deriveKeys(passphrase, salt, iterations)
  if (!sameBytes(check, storedCheck)) {
    throw new BackupError('wrong_passphrase', 'That passphrase does not open this file. Check it and try again.')
  }
  let plain: ArrayBuffer
  try {
    plain = await subtle().decrypt({ name: 'AES-GCM', iv }, key, data)
  } catch {
    throw damaged('part of it changed after it was made')
  }
  let parsed: unknown
  try {
    parsed = JSON.parse(new TextDecoder('utf-8', { fatal: true }).decode(plain))
  } catch {
    throw damaged('its contents are not readable')
  }
  const result = backupPayloadSchema.safeParse(parsed)
  if (!result.success) throw damaged(describeIssue(result.error.issues[0]?.path ?? []))
  return result.data
}

/** Points at the first broken entry in plain words, e.g. "entry 3 is not valid". */
export function describeIssue(path: readonly PropertyKey[]): string {
  const at = path.indexOf('entries')
  const index = at >= 0 ? path[at + 1] : undefined
  return typeof index === 'number' ? `entry ${index + 1} is not valid` : 'its layout is not valid'
}
