import { beforeEach, describe, expect, it } from 'vitest'
import type { Entry } from '@shared/schemas/entry.schema'
import { allEntriesForBackup, backupReminderState, mergeBackup, snoozeBackupReminder } from '@/db/backupRepository'
import { db } from '@/db/db'
import { createEntry, listJournal } from '@/db/entriesRepository'
import { entryWords } from '@/db/entryWords'
import { readSetting, writeSetting } from '@/db/settingsRepository'

const DAY = 24 * 60 * 60 * 1000
const NOW = 1_760_000_000_000

function entry(over: Partial<Entry> = {}): Entry {
  return {
    id: crypto.randomUUID(),
    kind: 'moment',
    createdAt: 1_700_000_000_000,
    updatedAt: 1_700_000_000_000,
    version: 1,
    body: 'Noticed the urge to check my phone',
    wants: [],
    backgroundThoughts: [],
    tags: [],
    shares: [],
    ...over,
  }
}

async function put(e: Entry) {
  await db.entries.put({ ...e, words: entryWords(e) })
}

beforeEach(async () => {
  await Promise.all([db.entries.clear(), db.settings.clear(), db.drafts.clear(), db.trash.clear()])
})

describe('mergeBackup', () => {
  it('adds new ids, replaces older versions and leaves equal or newer ones alone', async () => {
    const same = entry({ version: 2, body: 'same here' })
    const older = entry({ version: 1, body: 'old words here' })
    const newer = entry({ version: 5, body: 'newest words here' })
    await Promise.all([put(same), put(older), put(newer)])

    const fresh = entry({ body: 'from the other phone' })
    const result = await mergeBackup([
      fresh,
      { ...same, body: 'same version, other text' },
      { ...older, version: 3, body: 'edited later elsewhere' },
      { ...newer, version: 4, body: 'a stale copy' },
    ])

    expect(result).toEqual({ added: 1, updated: 1, skipped: 2 })
    expect(await db.entries.count()).toBe(4)
    expect((await db.entries.get(fresh.id))?.body).toBe('from the other phone')
    expect(await db.entries.get(older.id)).toMatchObject({ version: 3, body: 'edited later elsewhere' })
    expect(await db.entries.get(same.id)).toMatchObject({ version: 2, body: 'same here' })
    expect(await db.entries.get(newer.id)).toMatchObject({ version: 5, body: 'newest words here' })
  })

  it('brings every restored entry back private, even when the file had shares', async () => {
    const shared = entry({ shares: [{ linkId: 'link-a', state: 'shared', sentVersion: 1 }, { linkId: 'link-b', state: 'queued', sentVersion: 0 }] })
    const here = entry({ version: 1 })
    await put(here)
    await mergeBackup([shared, { ...here, version: 2, shares: [{ linkId: 'link-a', state: 'failed', sentVersion: 1 }] }])
    expect((await db.entries.get(shared.id))?.shares).toEqual([])
    expect((await db.entries.get(here.id))?.shares).toEqual([])
  })

  it('makes restored entries findable by search', async () => {
    const e = entry({ body: 'Walked by the canal', wants: [{ text: 'Quiet', ladder: [{ id: 'r', text: 'Steadiness' }] }] })
    await mergeBackup([{ ...e }])
    expect((await db.entries.get(e.id))?.words).toEqual(entryWords(e))
    expect((await listJournal({ query: 'canal' })).map((r) => r.id)).toEqual([e.id])
    expect((await listJournal({ query: 'steadi' })).map((r) => r.id)).toEqual([e.id])
  })

  it('ignores a words field smuggled into the file', async () => {
    const e = entry({ body: 'tea with a friend' })
    await mergeBackup([{ ...e, words: ['secretword'] } as Entry])
    expect((await db.entries.get(e.id))?.words).not.toContain('secretword')
  })

  it('adds nothing when the same entries are merged twice', async () => {
    const file = [entry(), entry({ version: 4 }), entry({ kind: 'tug' })]
    expect(await mergeBackup(file)).toEqual({ added: 3, updated: 0, skipped: 0 })
    const after = await db.entries.toArray()
    expect(await mergeBackup(file)).toEqual({ added: 0, updated: 0, skipped: 3 })
    expect(await db.entries.toArray()).toEqual(after)
  })

  it('counts an id listed twice once, keeping its highest version', async () => {
    const e = entry()
    const result = await mergeBackup([{ ...e, version: 2, body: 'second' }, { ...e, version: 7, body: 'seventh' }, { ...e, version: 3 }])
    expect(result).toEqual({ added: 1, updated: 0, skipped: 0 })
    expect(await db.entries.get(e.id)).toMatchObject({ version: 7, body: 'seventh' })
  })

  it('writes nothing when one entry is invalid', async () => {
    await expect(mergeBackup([entry(), { ...entry(), version: 0 }])).rejects.toThrow()
    expect(await db.entries.count()).toBe(0)
  })
})

describe('allEntriesForBackup', () => {
  it('returns every entry oldest first, without the search words', async () => {
    await createEntry({ kind: 'moment', body: 'second', createdAt: 2000, wants: [], backgroundThoughts: [], tags: [] })
    await createEntry({ kind: 'moment', body: 'first', createdAt: 1000, wants: [], backgroundThoughts: [], tags: [] })
    const all = await allEntriesForBackup()
    expect(all.map((e) => e.body)).toEqual(['first', 'second'])
    expect(all.every((e) => !('words' in e))).toBe(true)
  })
})

describe('backupReminderState', () => {
  it('stays quiet while there is nothing to lose', async () => {
    expect((await backupReminderState(NOW)).due).toBe(false)
  })

  it('is due when there are entries and no backup was ever made', async () => {
    await put(entry())
    expect(await backupReminderState(NOW)).toEqual({ due: true, lastBackupAt: undefined })
  })

  it('rests for 14 days after a backup', async () => {
    await put(entry())
    await writeSetting('lastBackupAt', NOW - 13 * DAY)
    expect((await backupReminderState(NOW)).due).toBe(false)
    await writeSetting('lastBackupAt', NOW - 14 * DAY)
    expect(await backupReminderState(NOW)).toEqual({ due: true, lastBackupAt: NOW - 14 * DAY })
  })

  it('stays away for 7 days after "Not now"', async () => {
    await put(entry())
    await snoozeBackupReminder(NOW - 6 * DAY)
    expect(await readSetting('backupReminderSnoozedAt')).toBe(NOW - 6 * DAY)
    expect((await backupReminderState(NOW)).due).toBe(false)
    await snoozeBackupReminder(NOW - 8 * DAY)
    expect((await backupReminderState(NOW)).due).toBe(true)
  })
})
