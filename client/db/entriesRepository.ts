import { searchWords } from '@shared/content/searchWords'
import type { Entry, EntryInput, EntryKind, entrySchema as EntrySchema } from '@shared/schemas/entry.schema'
import { dbNow, openDb } from './openDb'
import { loadedEntrySchemas, loadEntrySchemas } from './entrySchemas'
import { entryWords } from './entryWords'
import { isJournalKind, journalIndex, journalKinds } from './journalIndex'
import type { StoredEntry } from './RungsDB'

/** How long a deleted entry can still be brought back (and survives a closed tab). */
export const TRASH_KEEP_MS = 24 * 60 * 60 * 1000

/** Drops keys whose value is undefined, so a value never chosen is absent in IndexedDB, not a stored undefined. */
function withoutUndefined<T extends object>(o: T): T {
  return Object.fromEntries(Object.entries(o).filter(([, v]) => v !== undefined)) as T
}

function toStored(entrySchema: typeof EntrySchema, entry: Entry): StoredEntry {
  const parsed = entrySchema.parse(entry)
  return { ...withoutUndefined(parsed), wants: parsed.wants.map(withoutUndefined), words: entryWords(parsed) }
}

/** Strips the index-only field, so callers see the shared Entry shape. */
export function fromStored({ words: _words, ...entry }: StoredEntry): Entry {
  return entry
}

/** Creates an entry from what the person filled in; returns it with its new id and version 1. */
export async function createEntry(input: EntryInput, now = Date.now()): Promise<Entry> {
  const db = dbNow() ?? (await openDb())
  const { entryInputSchema, entrySchema } = await loadEntrySchemas()
  const data = entryInputSchema.parse(input)
  const entry: Entry = { ...data, id: crypto.randomUUID(), createdAt: data.createdAt ?? now, updatedAt: now, version: 1, shares: [] }
  await db.entries.add(toStored(entrySchema, entry))
  return entry
}

/** Saves an edit: the version rises by one so a later share can tell old from new. */
export async function updateEntry(id: string, patch: Partial<EntryInput>, now = Date.now()): Promise<Entry> {
  const db = dbNow() ?? (await openDb())
  // Loaded before the transaction: awaiting anything but IndexedDB inside one would end it. A caller that wraps this in
  // its own transaction (updateEntryAndRequeue) has loaded them already, so nothing is awaited there.
  const { entryInputSchema, entrySchema } = loadedEntrySchemas() ?? (await loadEntrySchemas())
  return db.transaction('rw', db.entries, async () => {
    const current = await db.entries.get(id)
    if (!current) throw new Error('That entry is no longer on this device.')
    const next: Entry = { ...fromStored(current), ...entryInputSchema.partial().parse(patch), id, updatedAt: now, version: current.version + 1 }
    await db.entries.put(toStored(entrySchema, next))
    return next
  })
}

export async function getEntry(id: string): Promise<Entry | undefined> {
  const db = dbNow() ?? (await openDb())
  const row = await db.entries.get(id)
  return row && fromStored(row)
}

export async function getEntries(ids: string[]): Promise<(Entry | undefined)[]> {
  const db = dbNow() ?? (await openDb())
  return (await db.entries.bulkGet(ids)).map((row) => row && fromStored(row))
}

/** Moves an entry to the trash in one transaction; `restoreEntry` is its undo. */
export async function trashEntry(id: string, now = Date.now()): Promise<void> {
  const db = dbNow() ?? (await openDb())
  await db.transaction('rw', db.entries, db.trash, async () => {
    const entry = await db.entries.get(id)
    if (!entry) return
    await db.trash.put({ id, entry, deletedAt: now })
    await db.entries.delete(id)
  })
}

export async function restoreEntry(id: string): Promise<boolean> {
  const db = dbNow() ?? (await openDb())
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
  const db = dbNow() ?? (await openDb())
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

/**
 * The ids and times of matching entries, newest first. Answered from the in-memory journal index, so typing in the
 * search box never scans IndexedDB: each query word is a prefix lookup in a sorted word list, and filters are checks
 * on rows already in memory.
 */
export async function listJournal(filter: JournalFilter = {}): Promise<JournalRow[]> {
  const db = dbNow() ?? (await openDb())
  // Reading the count ties a caller's liveQuery to every change of the table, so the list re-runs after each write.
  await db.entries.count()
  const index = await journalIndex()
  let wanted: Set<string> | undefined
  for (const word of searchWords(filter.query)) {
    const ids = index.withPrefix(word)
    wanted = wanted ? new Set([...wanted].filter((id) => ids.has(id))) : ids
    if (!wanted.size) return []
  }
  const { kinds, tag, from, to } = filter
  const rows: JournalRow[] = []
  for (const r of index.rows) {
    if (wanted && !wanted.has(r.id)) continue
    if (kinds?.length && !kinds.includes(r.kind)) continue
    if (tag && !r.tags.includes(tag)) continue
    if ((from !== undefined && r.createdAt < from) || (to !== undefined && r.createdAt > to)) continue
    rows.push({ id: r.id, createdAt: r.createdAt })
  }
  return rows
}

/** The latest journal entries (moments and tugs; questionnaires and the safety plan have their own screens). */
export async function recentEntries(limit: number): Promise<Entry[]> {
  const db = dbNow() ?? (await openDb())
  return (await db.entries.orderBy('createdAt').reverse().filter((e) => isJournalKind(e.kind)).limit(limit).toArray()).map(fromStored)
}

/** Entries whose time falls in [from, to], oldest first, for patterns and summaries. */
export async function entriesBetween(from: number, to: number): Promise<Entry[]> {
  const db = dbNow() ?? (await openDb())
  return (await db.entries.where('createdAt').between(from, to, true, true).toArray()).map(fromStored)
}

/** Every tag in use, from the tags index alone. */
export async function tagsInUse(): Promise<string[]> {
  const db = dbNow() ?? (await openDb())
  return (await db.entries.orderBy('tags').uniqueKeys()) as string[]
}

/** Every entry on this device, of any kind (what a backup holds). */
export async function countEntries(): Promise<number> {
  const db = dbNow() ?? (await openDb())
  return db.entries.count()
}

/** Moments and tugs only, from the kind index. */
export async function countJournalEntries(): Promise<number> {
  const db = dbNow() ?? (await openDb())
  return db.entries.where('kind').anyOf([...journalKinds]).count()
}
