import { searchWords } from '@shared/content/searchWords'
import { entryInputSchema, entrySchema, type Entry, type EntryInput, type EntryKind } from '@shared/schemas/entry.schema'
import { db } from './db'
import { entryWords } from './entryWords'
import type { StoredEntry } from './RungsDB'

/** How long a deleted entry can still be brought back (and survives a closed tab). */
export const TRASH_KEEP_MS = 24 * 60 * 60 * 1000

/** Drops keys whose value is undefined, so a value never chosen is absent in IndexedDB, not a stored undefined. */
function withoutUndefined<T extends object>(o: T): T {
  return Object.fromEntries(Object.entries(o).filter(([, v]) => v !== undefined)) as T
}

function toStored(entry: Entry): StoredEntry {
  const parsed = entrySchema.parse(entry)
  return { ...withoutUndefined(parsed), wants: parsed.wants.map(withoutUndefined), words: entryWords(parsed) }
}

/** Strips the index-only field, so callers see the shared Entry shape. */
export function fromStored({ words: _words, ...entry }: StoredEntry): Entry {
  return entry
}

/** Creates an entry from what the person filled in; returns it with its new id and version 1. */
export async function createEntry(input: EntryInput, now = Date.now()): Promise<Entry> {
  const data = entryInputSchema.parse(input)
  const entry: Entry = { ...data, id: crypto.randomUUID(), createdAt: data.createdAt ?? now, updatedAt: now, version: 1, shares: [] }
  await db.entries.add(toStored(entry))
  return entry
}

/** Saves an edit: the version rises by one so a later share can tell old from new. */
export async function updateEntry(id: string, patch: Partial<EntryInput>, now = Date.now()): Promise<Entry> {
  return db.transaction('rw', db.entries, async () => {
    const current = await db.entries.get(id)
    if (!current) throw new Error('That entry is no longer on this device.')
    const next: Entry = { ...fromStored(current), ...entryInputSchema.partial().parse(patch), id, updatedAt: now, version: current.version + 1 }
    await db.entries.put(toStored(next))
    return next
  })
}

export async function getEntry(id: string): Promise<Entry | undefined> {
  const row = await db.entries.get(id)
  return row && fromStored(row)
}

export async function getEntries(ids: string[]): Promise<(Entry | undefined)[]> {
  return (await db.entries.bulkGet(ids)).map((row) => row && fromStored(row))
}

/** Moves an entry to the trash in one transaction; `restoreEntry` is its undo. */
export async function trashEntry(id: string, now = Date.now()): Promise<void> {
  await db.transaction('rw', db.entries, db.trash, async () => {
    const entry = await db.entries.get(id)
    if (!entry) return
    await db.trash.put({ id, entry, deletedAt: now })
    await db.entries.delete(id)
  })
}

export async function restoreEntry(id: string): Promise<boolean> {
  return db.transaction('rw', db.entries, db.trash, async () => {
    const row = await db.trash.get(id)
    if (!row) return false
    await db.entries.put(row.entry)
    await db.trash.delete(id)
    return true
  })
}

/** Forgets deleted entries once the undo window has long passed. */
export async function purgeTrash(now = Date.now()): Promise<number> {
  return db.trash.where('deletedAt').below(now - TRASH_KEEP_MS).delete()
}

export interface JournalFilter {
  query?: string
  kinds?: EntryKind[]
  tag?: string
  /** Inclusive epoch-ms bounds on createdAt. */
  from?: number
  to?: number
}

export interface JournalRow {
  id: string
  createdAt: number
}

async function keysForWord(prefix: string): Promise<Set<string>> {
  return new Set((await db.entries.where('words').startsWith(prefix).primaryKeys()) as string[])
}

function intersect(sets: Set<string>[]): Set<string> | undefined {
  if (!sets.length) return undefined
  const [first, ...rest] = [...sets].sort((a, b) => a.size - b.size)
  return new Set([...first!].filter((k) => rest.every((s) => s.has(k))))
}

/**
 * The ids and times of matching entries, newest first. Reads only indexes (never whole rows), so it stays quick with
 * thousands of entries: each query word is a prefix lookup on the words index, each filter an index range.
 */
export async function listJournal(filter: JournalFilter = {}): Promise<JournalRow[]> {
  const sets: Set<string>[] = []
  for (const word of searchWords(filter.query)) sets.push(await keysForWord(word))
  if (filter.kinds?.length) sets.push(new Set((await db.entries.where('kind').anyOf(filter.kinds).primaryKeys()) as string[]))
  if (filter.tag) sets.push(new Set((await db.entries.where('tags').equals(filter.tag).primaryKeys()) as string[]))
  const wanted = intersect(sets)
  if (wanted && !wanted.size) return []

  const range = filter.from !== undefined || filter.to !== undefined
    ? db.entries.where('createdAt').between(filter.from ?? 0, filter.to ?? Number.MAX_SAFE_INTEGER, true, true)
    : db.entries.orderBy('createdAt')
  const ordered = range.reverse()
  const [times, ids] = await Promise.all([ordered.keys(), ordered.primaryKeys()])
  const rows: JournalRow[] = []
  for (let i = 0; i < ids.length; i++) {
    const id = ids[i] as string
    if (!wanted || wanted.has(id)) rows.push({ id, createdAt: times[i] as number })
  }
  return rows
}

export async function recentEntries(limit: number): Promise<Entry[]> {
  return (await db.entries.orderBy('createdAt').reverse().limit(limit).toArray()).map(fromStored)
}

/** Entries whose time falls in [from, to], oldest first, for patterns and summaries. */
export async function entriesBetween(from: number, to: number): Promise<Entry[]> {
  return (await db.entries.where('createdAt').between(from, to, true, true).toArray()).map(fromStored)
}

/** Every tag in use, from the tags index alone. */
export async function tagsInUse(): Promise<string[]> {
  return (await db.entries.orderBy('tags').uniqueKeys()) as string[]
}

export async function countEntries(): Promise<number> {
  return db.entries.count()
}
