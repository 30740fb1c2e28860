import { beforeEach, describe, expect, it } from 'vitest'
import { db } from '@/db/db'
import { countEntries, createEntry, entriesBetween, getEntry, listJournal, purgeTrash, restoreEntry, tagsInUse, TRASH_KEEP_MS, trashEntry, updateEntry } from '@/db/entriesRepository'
import type { EntryInput } from '@shared/schemas/entry.schema'

const moment = (body: string, extra: Partial<EntryInput> = {}): EntryInput => ({ kind: 'moment', body, wants: [], backgroundThoughts: [], tags: [], ...extra })
const tug = (extra: Partial<EntryInput> = {}): EntryInput => ({
  kind: 'tug',
  body: 'Dinner with my sister',
  wants: [
    { text: 'Speak up about the holiday plans', importance: 8, ladder: [{ id: 'r1', text: 'Being heard' }, { id: 'r2', text: 'Feeling respected' }] },
    { text: 'Keep the peace', importance: 6, ladder: [{ id: 'r3', text: 'Closeness with family' }] },
  ],
  meetingPoint: 'A family where everyone counts',
  backgroundThoughts: ['She always decides'],
  tags: ['family'],
  ...extra,
})

describe('entriesRepository', () => {
  beforeEach(async () => {
    await Promise.all([db.entries.clear(), db.trash.clear(), db.drafts.clear()])
  })

  it('stores an untouched distress as absent, never as a default number', async () => {
    const e = await createEntry(moment('Bus was late'))
    const stored = await db.entries.get(e.id)
    expect(stored).toBeDefined()
    expect('distressBefore' in stored!).toBe(false)
    expect(stored!.version).toBe(1)
    expect(stored!.shares).toEqual([])
  })

  it('raises the version by one with each saved edit', async () => {
    const e = await createEntry(moment('First words', { distressBefore: 40 }))
    await updateEntry(e.id, { body: 'Second words' })
    const again = await updateEntry(e.id, { distressBefore: 55 })
    expect(again.version).toBe(3)
    expect((await getEntry(e.id))?.body).toBe('Second words')
    expect((await getEntry(e.id))?.distressBefore).toBe(55)
  })

  it('finds a tug by a word from a rung, by prefix, with several words narrowing', async () => {
    const t = await createEntry(tug())
    await createEntry(moment('Respectful talk at work'))
    expect((await listJournal({ query: 'respected' })).map((r) => r.id)).toEqual([t.id])
    expect((await listJournal({ query: 'respect' })).length).toBe(2)
    expect((await listJournal({ query: 'respect family' })).map((r) => r.id)).toEqual([t.id])
    expect(await listJournal({ query: 'nowhere-to-be-found' })).toEqual([])
  })

  it('keeps search in step with edits and deletes (the in-memory index is rebuilt after each change)', async () => {
    const e = await createEntry(moment('Thunder at night'))
    expect((await listJournal({ query: 'thunder' })).map((r) => r.id)).toEqual([e.id])
    await updateEntry(e.id, { body: 'Rain at night' })
    expect(await listJournal({ query: 'thunder' })).toEqual([])
    expect((await listJournal({ query: 'rain' })).map((r) => r.id)).toEqual([e.id])
    await trashEntry(e.id)
    expect(await listJournal({ query: 'rain' })).toEqual([])
    await restoreEntry(e.id)
    expect((await listJournal({ query: 'rain' })).map((r) => r.id)).toEqual([e.id])
  })

  it('filters by kind, tag and date range, newest first', async () => {
    const old = await createEntry(moment('Old one', { createdAt: Date.UTC(2026, 0, 5), tags: ['work'] }))
    const mid = await createEntry(tug({ createdAt: Date.UTC(2026, 5, 5) }))
    const recent = await createEntry(moment('Recent one', { createdAt: Date.UTC(2026, 10, 5), tags: ['work'] }))
    expect((await listJournal()).map((r) => r.id)).toEqual([recent.id, mid.id, old.id])
    expect((await listJournal({ kinds: ['tug'] })).map((r) => r.id)).toEqual([mid.id])
    expect((await listJournal({ tag: 'work' })).map((r) => r.id)).toEqual([recent.id, old.id])
    expect((await listJournal({ from: Date.UTC(2026, 4, 1), to: Date.UTC(2026, 6, 1) })).map((r) => r.id)).toEqual([mid.id])
    expect((await entriesBetween(Date.UTC(2026, 0, 1), Date.UTC(2026, 6, 1))).map((e) => e.id)).toEqual([old.id, mid.id])
  })

  it('moves a deleted entry to the trash and brings it back on undo', async () => {
    const e = await createEntry(moment('Keep me'))
    await trashEntry(e.id)
    expect(await getEntry(e.id)).toBeUndefined()
    expect(await countEntries()).toBe(0)
    expect(await restoreEntry(e.id)).toBe(true)
    expect((await getEntry(e.id))?.body).toBe('Keep me')
    expect(await db.trash.count()).toBe(0)
  })

  it('forgets trashed entries only after the undo window', async () => {
    const e = await createEntry(moment('Gone later'))
    await trashEntry(e.id, 1_000)
    expect(await purgeTrash(1_000 + TRASH_KEEP_MS - 1)).toBe(0)
    expect(await purgeTrash(1_000 + TRASH_KEEP_MS + 1)).toBe(1)
    expect(await restoreEntry(e.id)).toBe(false)
  })

  it('lists every tag in use from the index', async () => {
    await createEntry(moment('a', { tags: ['work', 'sleep'] }))
    await createEntry(moment('b', { tags: ['work'] }))
    expect(await tagsInUse()).toEqual(['sleep', 'work'])
  })

  it('refuses an entry that breaks the schema and writes nothing', async () => {
    await expect(createEntry(moment('x', { distressBefore: 140 }))).rejects.toThrow()
    expect(await countEntries()).toBe(0)
  })
})
