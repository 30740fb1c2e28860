import { describe, expect, it } from 'vitest'
import type { BackupPayload, LockedBackupFile } from '@shared/schemas/backup.schema'
import type { Entry } from '@shared/schemas/entry.schema'
import { BackupError, base64ToBytes, bytesToBase64, lockBackup, unlockBackup } from '@/backup/backupCrypto'

// Few iterations keep the tests quick; the app itself always uses 600 000.
const FAST = 1000
const fast = { minIterations: FAST }
const passphrase = 'a quiet harbour at dusk'

function entry(over: Partial<Entry> = {}): Entry {
  return {
    id: crypto.randomUUID(),
    kind: 'moment',
    createdAt: 1_700_000_000_000,
    updatedAt: 1_700_000_000_000,
    version: 1,
    body: 'I wanted to leave the party early and also to stay with my friend.',
    wants: [],
    backgroundThoughts: [],
    tags: ['evening'],
    shares: [],
    ...over,
  }
}

const payload: BackupPayload = { exportedAt: 1_700_000_100_000, entries: [entry(), entry({ kind: 'tug', body: 'Rest or finish the essay', version: 3 })] }

async function errorOf(promise: Promise<unknown>): Promise<BackupError> {
  const err = await promise.then(() => undefined, (e: unknown) => e)
  expect(err).toBeInstanceOf(BackupError)
  return err as BackupError
}

function flipByte(b64: string, at: number): string {
  const bytes = base64ToBytes(b64)
  bytes[at] = bytes[at]! ^ 0x01
  return bytesToBase64(bytes)
}

describe('lockBackup / unlockBackup', () => {
  it('gives back exactly what was locked, with the right passphrase', async () => {
    const file = await lockBackup(payload, passphrase, FAST)
    expect(await unlockBackup(file, passphrase, fast)).toEqual(payload)
  })

  it('writes PBKDF2-SHA-256 and AES-GCM settings with a 16-byte salt and a 12-byte iv, and no readable text', async () => {
    const file = await lockBackup(payload, passphrase, FAST)
    expect(file).toMatchObject({ format: 'rungs-backup', formatVersion: 1, locked: true })
    expect(file.kdf).toMatchObject({ name: 'PBKDF2', hash: 'SHA-256', iterations: FAST })
    expect(base64ToBytes(file.kdf.salt)).toHaveLength(16)
    expect(base64ToBytes(file.cipher.iv)).toHaveLength(12)
    expect(file.cipher.name).toBe('AES-GCM')
    const text = JSON.stringify(file)
    expect(text).not.toContain('party')
    expect(text).not.toContain('evening')
  })

  it('uses a fresh salt and iv every time, so two files of the same journal differ', async () => {
    const a = await lockBackup(payload, passphrase, FAST)
    const b = await lockBackup(payload, passphrase, FAST)
    expect(a.kdf.salt).not.toBe(b.kdf.salt)
    expect(a.cipher.iv).not.toBe(b.cipher.iv)
    expect(a.data).not.toBe(b.data)
  })

  it('says "wrong passphrase" for a wrong passphrase', async () => {
    const file = await lockBackup(payload, passphrase, FAST)
    const err = await errorOf(unlockBackup(file, 'a quiet harbour at dawn', fast))
    expect(err.code).toBe('wrong_passphrase')
    expect(err.message).toMatch(/passphrase/i)
  })

  it('says "damaged" when the encrypted data was changed, even with the right passphrase', async () => {
    const file = await lockBackup(payload, passphrase, FAST)
    const tampered: LockedBackupFile = { ...file, data: flipByte(file.data, 5) }
    expect((await errorOf(unlockBackup(tampered, passphrase, fast))).code).toBe('damaged')
  })

  it('says "damaged" when the iv was changed', async () => {
    const file = await lockBackup(payload, passphrase, FAST)
    const tampered: LockedBackupFile = { ...file, cipher: { ...file.cipher, iv: flipByte(file.cipher.iv, 0) } }
    expect((await errorOf(unlockBackup(tampered, passphrase, fast))).code).toBe('damaged')
  })

  it('says "damaged" when the data is too short to hold an authentication tag', async () => {
    const file = await lockBackup(payload, passphrase, FAST)
    const cut: LockedBackupFile = { ...file, data: bytesToBase64(base64ToBytes(file.data).subarray(0, 8)) }
    expect((await errorOf(unlockBackup(cut, passphrase, fast))).code).toBe('damaged')
  })

  it('treats fewer than 100 000 iterations as damaged unless a lower floor is asked for', async () => {
    const file = await lockBackup(payload, passphrase, FAST)
    const err = await errorOf(unlockBackup(file, passphrase))
    expect(err.code).toBe('damaged')
  })

  it('treats more than 10 000 000 iterations as damaged, without trying to derive the key', async () => {
    const file = await lockBackup(payload, passphrase, FAST)
    const huge: LockedBackupFile = { ...file, kdf: { ...file.kdf, iterations: 50_000_000 } }
    const started = performance.now()
    expect((await errorOf(unlockBackup(huge, passphrase, fast))).code).toBe('damaged')
    expect(performance.now() - started).toBeLessThan(1000)
  })

  it('opens a file with the same passphrase typed with composed or decomposed accents', async () => {
    const composed = 'caf\u00e9 cr\u00e8me br\u00fbl\u00e9e'
    const decomposed = composed.normalize('NFD')
    expect(decomposed).not.toBe(composed)
    const file = await lockBackup(payload, composed, FAST)
    expect(await unlockBackup(file, decomposed, fast)).toEqual(payload)
  })
})

describe('base64 helpers', () => {
  it('round-trips bytes larger than one chunk', () => {
    const bytes = new Uint8Array(100_000).map((_, i) => (i * 31) % 256)
    expect(base64ToBytes(bytesToBase64(bytes))).toEqual(bytes)
  })

  it('reports broken base64 as a damaged file', () => {
    expect(() => base64ToBytes('@@not base64@@')).toThrowError(expect.objectContaining({ code: 'damaged' }))
  })
})
