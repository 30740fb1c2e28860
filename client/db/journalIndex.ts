import type { EntryKind } from '@shared/schemas/entry.schema'
import { dbNow, openDb } from './openDb'

export interface IndexRow {
  id: string
  createdAt: number
  kind: EntryKind
  tags: string[]
}

/** The journal's rows and words in memory, newest first, so a search never walks IndexedDB per keystroke. */
export interface JournalIndex {
  rows: IndexRow[]
  /** Ids of the entries holding any word that starts with the prefix. */
  withPrefix(prefix: string): Set<string>
}

function lowerBound(sorted: string[], key: string): number {
  let lo = 0, hi = sorted.length
  while (lo < hi) {
    const mid = (lo + hi) >> 1
    if (sorted[mid]! < key) lo = mid + 1
    else hi = mid
  }
  return lo
}

/** Kinds with screens of their own (Measures, Safety plan); the journal list, recent entries and counts leave them out. */
export const journalKinds: readonly EntryKind[] = ['moment', 'tug']
export const isJournalKind = (kind: EntryKind): boolean => journalKinds.includes(kind)

async function build(): Promise<JournalIndex> {
  const db = dbNow() ?? (await openDb())
  const rows: IndexRow[] = []
  const postings = new Map<string, string[]>()
  await db.entries.each((e) => {
    if (!isJournalKind(e.kind)) return
    rows.push({ id: e.id, createdAt: e.createdAt, kind: e.kind, tags: e.tags })
    for (const w of e.words) {
      const list = postings.get(w)
      if (list) list.push(e.id)
      else postings.set(w, [e.id])
    }
  })
  rows.sort((a, b) => b.createdAt - a.createdAt || (a.id < b.id ? 1 : -1))
  const words = [...postings.keys()].sort()
  return {
    rows,
    withPrefix(prefix) {
      const found = new Set<string>()
      for (let i = lowerBound(words, prefix); i < words.length && words[i]!.startsWith(prefix); i++) {
        for (const id of postings.get(words[i]!)!) found.add(id)
      }
      return found
    },
  }
}

let cached: Promise<JournalIndex> | undefined
let generation = 0

/** Called by db/db.ts for every change Dexie reports, in this tab or another: a change to the entries table drops the index. */
export function dropJournalIndexOn(changed: string[], dbName: string): void {
  if (changed.some((p) => p.startsWith(`idb://${dbName}/entries/`))) {
    generation++
    cached = undefined
  }
}

/** The in-memory index, built once (one pass over the table) and again after each change. */
export function journalIndex(): Promise<JournalIndex> {
  if (!cached) {
    const started = generation
    const building = build()
    cached = building
    // A write during the build may be missing from it: keep it for this answer only.
    void building.then(() => { if (generation !== started && cached === building) cached = undefined }, () => { if (cached === building) cached = undefined })
  }
  return cached
}
