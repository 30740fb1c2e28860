import { beforeEach, describe, expect, it } from 'vitest'
import type { Entry } from '@shared/schemas/entry.schema'
import { BackupError, base64ToBytes, bytesToBase64 } from '@/backup/backupCrypto'
import { backupFileName, describeRestore, makeBackupFile, readBackupFile, restoreBackupFile } from '@/backup/backupFile'
import { allEntriesForBackup } from '@/db/backupRepository'
import { db } from '@/db/db'
import { createEntry, updateEntry } from '@/db/entriesRepository'
import { readSetting } from '@/db/settingsRepository'

// Few iterations keep the tests quick; one test below checks what the app itself writes.
const FAST = 1000
const fast = { minIterations: FAST }
const passphrase = 'lanterns on the river'

async function seed(): Promise<Entry[]> {
  const a = await createEntry({ kind: 'moment', body: 'Tight chest before the meeting', distressBefore: 70, wants: [], backgroundThoughts: [], tags: ['work'] })
  await createEntry({
    kind: 'tug',
    body: 'Call my sister or keep the evening to myself',
    wants: [{ text: 'Call her', importance: 7, ladder: [{ id: 'r1', text: 'Feel close' }] }, { text: 'Rest', ladder: [] }],
    meetingPoint: 'Being cared for',
    backgroundThoughts: ['She sounded tired'],
    tags: [],
  })
  await updateEntry(a.id, { body: 'Tight chest before the meeting, easing after' })
  return allEntriesForBackup()
}

/** The whole entries table, words included, to show that a failed restore changed nothing. */
async function snapshot() {
  return db.entries.orderBy('id').toArray()
}

async function errorOf(promise: Promise<unknown>): Promise<BackupError> {
  const err = await promise.then(() => undefined, (e: unknown) => e)
  expect(err).toBeInstanceOf(BackupError)
  return err as BackupError
}

beforeEach(async () => {
  await Promise.all([db.entries.clear(), db.settings.clear(), db.drafts.clear(), db.trash.clear()])
})

describe('makeBackupFile and readBackupFile', () => {
  it('round-trips a locked file: every entry comes back as it was', async () => {
    const entries = await seed()
    const made = await makeBackupFile({ passphrase, iterations: FAST }, 1_750_000_000_000)
    expect(made).toMatchObject({ locked: true, entryCount: 2 })
    const read = await readBackupFile(made.text, passphrase, fast)
    expect(read.locked).toBe(true)
    expect(read.exportedAt).toBe(1_750_000_000_000)
    expect(read.entries).toEqual(entries)
  })

  it('keeps what is written out of a locked file', async () => {
    await seed()
    const { text } = await makeBackupFile({ passphrase, iterations: FAST })
    expect(text).not.toContain('sister')
    expect(text).not.toContain('Tight chest')
    expect(JSON.parse(text)).toMatchObject({ format: 'rungs-backup', formatVersion: 1, locked: true })
  })

  it('round-trips an unlocked file, which needs no passphrase', async () => {
    const entries = await seed()
    const made = await makeBackupFile({ unlocked: true })
    expect(made.locked).toBe(false)
    expect(JSON.parse(made.text)).toMatchObject({ format: 'rungs-backup', formatVersion: 1, locked: false, entries })
    const read = await readBackupFile(made.text)
    expect(read).toMatchObject({ locked: false, entries })
  })

  it('locks the file unless an unlocked one is asked for explicitly', async () => {
    await seed()
    expect((await errorOf(makeBackupFile({}))).code).toBe('passphrase_needed')
    expect((await errorOf(makeBackupFile({ unlocked: false }))).code).toBe('passphrase_needed')
    expect(await readSetting('lastBackupAt')).toBeUndefined()
  })

  it('refuses a passphrase shorter than 8 characters', async () => {
    const err = await errorOf(makeBackupFile({ passphrase: 'short12', iterations: FAST }))
    expect(err.code).toBe('passphrase_too_short')
  })

  it('records when the backup was made', async () => {
    await seed()
    await makeBackupFile({ passphrase, iterations: FAST }, 1_760_000_000_000)
    expect(await readSetting('lastBackupAt')).toBe(1_760_000_000_000)
  })

  it('names the file after the local date', () => {
    expect(backupFileName(new Date(2025, 2, 7, 23, 30).getTime())).toBe('rungs-backup-2025-03-07.json')
  })

  it('writes 600 000 PBKDF2 iterations when made as the app makes it, and reads that back', async () => {
    const entries = await seed()
    const { text } = await makeBackupFile({ passphrase })
    expect(JSON.parse(text).kdf.iterations).toBe(600000)
    expect((await readBackupFile(text, passphrase)).entries).toEqual(entries)
  })
})

describe('readBackupFile errors', () => {
  it('asks for the passphrase when the file is locked and none is given', async () => {
    await seed()
    const { text } = await makeBackupFile({ passphrase, iterations: FAST })
    const err = await errorOf(readBackupFile(text, undefined, fast))
    expect(err.code).toBe('passphrase_needed')
  })

  it('says "not JSON" for text that is not JSON, or a file cut short', async () => {
    await seed()
    const { text } = await makeBackupFile({ unlocked: true })
    expect((await errorOf(readBackupFile('Dear diary,'))).code).toBe('not_json')
    expect((await errorOf(readBackupFile(text.slice(0, text.length / 2)))).code).toBe('not_json')
  })

  it('says "not a Rungs backup" for some other JSON', async () => {
    for (const text of ['{"hello":1}', '[1,2,3]', '"rungs-backup"', 'null', '{"format":"some-other-journal","formatVersion":1}']) {
      const err = await errorOf(readBackupFile(text))
      expect(err.code, text).toBe('not_rungs_backup')
      expect(err.message).toContain('not a Rungs backup')
    }
  })

  it('says the file comes from a newer Rungs when its format version is higher', async () => {
    const text = JSON.stringify({ format: 'rungs-backup', formatVersion: 2, locked: false, exportedAt: 1, entries: [], extra: {} })
    const err = await errorOf(readBackupFile(text))
    expect(err.code).toBe('newer_version')
    expect(err.message).toContain('newer version of Rungs')
  })

  it('refuses text over 20 MB before parsing it', async () => {
    const err = await errorOf(readBackupFile(' '.repeat(20 * 1024 * 1024 + 1)))
    expect(err.code).toBe('too_large')
  })

  it('says "damaged" for an unlocked file with an invalid entry, and names the entry', async () => {
    const entries = await seed()
    const text = JSON.stringify({ format: 'rungs-backup', formatVersion: 1, locked: false, exportedAt: 1, entries: [entries[0], { ...entries[1], distressBefore: 250 }] })
    const err = await errorOf(readBackupFile(text))
    expect(err.code).toBe('damaged')
    expect(err.message).toContain('entry 2')
  })

  it('says "damaged" when the encrypted data is not valid base64', async () => {
    await seed()
    const file = JSON.parse((await makeBackupFile({ passphrase, iterations: FAST })).text)
    const text = JSON.stringify({ ...file, data: `${file.data.slice(0, -4)}!!!!` })
    expect((await errorOf(readBackupFile(text, passphrase, fast))).code).toBe('damaged')
  })

  it('says "damaged" when a locked file is missing its cipher settings', async () => {
    await seed()
    const { cipher: _cipher, ...file } = JSON.parse((await makeBackupFile({ passphrase, iterations: FAST })).text)
    expect((await errorOf(readBackupFile(JSON.stringify(file), passphrase, fast))).code).toBe('damaged')
  })
})

describe('restoreBackupFile', () => {
  it('changes nothing when the passphrase is wrong', async () => {
    await seed()
    const { text } = await makeBackupFile({ passphrase, iterations: FAST })
    await db.entries.clear()
    await createEntry({ kind: 'moment', body: 'Only this one is here now', wants: [], backgroundThoughts: [], tags: [] })
    const before = await snapshot()
    const err = await errorOf(restoreBackupFile(text, 'lanterns on the lake', fast))
    expect(err.code).toBe('wrong_passphrase')
    expect(await snapshot()).toEqual(before)
  })

  it('changes nothing when the encrypted data was tampered with', async () => {
    await seed()
    const file = JSON.parse((await makeBackupFile({ passphrase, iterations: FAST })).text)
    const bytes = base64ToBytes(file.data)
    bytes[3] = bytes[3]! ^ 0x80
    await db.entries.clear()
    const err = await errorOf(restoreBackupFile(JSON.stringify({ ...file, data: bytesToBase64(bytes) }), passphrase, fast))
    expect(err.code).toBe('damaged')
    expect(await db.entries.count()).toBe(0)
  })

  it('changes nothing when one entry of an unlocked file is invalid', async () => {
    const entries = await seed()
    await db.entries.clear()
    const text = JSON.stringify({ format: 'rungs-backup', formatVersion: 1, locked: false, exportedAt: 1, entries: [entries[0], { ...entries[1], id: 'not-a-uuid' }] })
    expect((await errorOf(restoreBackupFile(text))).code).toBe('damaged')
    expect(await db.entries.count()).toBe(0)
  })

  it('brings a journal back onto an empty device, with every entry private', async () => {
    const entries = await seed()
    await db.entries.update(entries[0]!.id, { shares: [{ linkId: 'link-1', state: 'shared', sentVersion: 2 }] })
    const { text } = await makeBackupFile({ passphrase, iterations: FAST })
    expect((await readBackupFile(text, passphrase, fast)).entries.some((e) => e.shares.length > 0)).toBe(true)
    await db.entries.clear()

    const result = await restoreBackupFile(text, passphrase, fast)
    expect(result).toMatchObject({ added: 2, updated: 0, skipped: 0 })
    const restored = await allEntriesForBackup()
    expect(restored.map((e) => e.id).sort()).toEqual(entries.map((e) => e.id).sort())
    expect(restored.every((e) => e.shares.length === 0)).toBe(true)
  })

  it('adds nothing when the same file is restored twice', async () => {
    await seed()
    const { text } = await makeBackupFile({ unlocked: true })
    await db.entries.clear()
    expect(await restoreBackupFile(text)).toMatchObject({ added: 2, updated: 0, skipped: 0 })
    const after = await snapshot()
    expect(await restoreBackupFile(text)).toMatchObject({ added: 0, updated: 0, skipped: 2 })
    expect(await snapshot()).toEqual(after)
  })
})

describe('describeRestore', () => {
  it('reads as a plain summary', () => {
    expect(describeRestore({ added: 12, updated: 3, skipped: 2 })).toBe('12 entries added, 3 updated, 2 already here')
    expect(describeRestore({ added: 1, updated: 0, skipped: 0 })).toBe('1 entry added')
    expect(describeRestore({ added: 0, updated: 0, skipped: 4 })).toBe('4 entries already here')
    expect(describeRestore({ added: 0, updated: 0, skipped: 0 })).toBe('The file held no entries')
  })
})
