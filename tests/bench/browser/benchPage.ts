// The app's own repository code, bundled as the app bundles it, so the figures are for what people run.
import { db } from '@/db/db'
import { createEntry, listJournal, type JournalFilter } from '@/db/entriesRepository'
import { entryWords } from '@/db/entryWords'
import type { StoredEntry } from '@/db/RungsDB'
import { entrySchema, type Entry, type EntryInput } from '@shared/schemas/entry.schema'
import { spread, type BenchResults, type QueryTiming } from '../benchResults'
import { makeGenerator, RARE_WORDS } from './benchEntries'

declare global {
  interface Window {
    runBench(): Promise<BenchResults>
    __benchResults?: BenchResults
    __benchError?: string
  }
}

const SAVES = 200
const WARM_UP = 10
const SAVES_WHEN_FULL = 50
const JOURNAL_SIZE = 10_000
const SEARCH_ROUNDS = 3
const LIST_ROUNDS = 5
const DAY = 24 * 60 * 60 * 1000
const RAW_DB = 'rungsBenchRaw'
// Right after 10 000 adds, reads here ran about twice as slow as 20 s later (Chromium's store is still settling, most
// likely compacting). A real journal grows over months, so searches are timed on a settled store.
const SETTLE_MS = 15_000

// A copy of the repository's private toStored, so the bulk journal holds the same rows createEntry writes.
function withoutUndefined<T extends object>(o: T): T {
  return Object.fromEntries(Object.entries(o).filter(([, v]) => v !== undefined)) as T
}
function toStoredRow(input: EntryInput, now: number): StoredEntry {
  const entry: Entry = { ...input, id: crypto.randomUUID(), createdAt: input.createdAt ?? now, updatedAt: input.createdAt ?? now, version: 1, shares: [] }
  const parsed = entrySchema.parse(entry)
  return { ...withoutUndefined(parsed), wants: parsed.wants.map(withoutUndefined), words: entryWords(parsed) }
}

function openRawDb(): Promise<IDBDatabase> {
  return new Promise((resolve, reject) => {
    const req = indexedDB.open(RAW_DB, 1)
    req.onupgradeneeded = () => {
      // Same keys and indexes as the app's entries table, so the ratio shows what the app adds on top of IndexedDB.
      const indexed = req.result.createObjectStore('indexed', { keyPath: 'id' })
      for (const name of ['createdAt', 'updatedAt', 'kind']) indexed.createIndex(name, name)
      indexed.createIndex('tags', 'tags', { multiEntry: true })
      indexed.createIndex('words', 'words', { multiEntry: true })
      req.result.createObjectStore('plain', { keyPath: 'id' })
    }
    req.onsuccess = () => resolve(req.result)
    req.onerror = () => reject(req.error)
  })
}

function deleteRawDb(): Promise<void> {
  return new Promise((resolve, reject) => {
    const req = indexedDB.deleteDatabase(RAW_DB)
    req.onsuccess = () => resolve()
    req.onerror = () => reject(req.error)
  })
}

/** One put in its own readwrite transaction, done when the transaction completes. */
function rawPut(raw: IDBDatabase, store: string, row: StoredEntry): Promise<void> {
  return new Promise((resolve, reject) => {
    const tx = raw.transaction(store, 'readwrite')
    tx.objectStore(store).put(row)
    tx.oncomplete = () => resolve()
    tx.onerror = () => reject(tx.error)
    tx.onabort = () => reject(tx.error)
  })
}

async function timed(run: () => Promise<unknown>): Promise<number> {
  const start = performance.now()
  await run()
  return performance.now() - start
}

async function benchSaves(): Promise<BenchResults['save']> {
  const gen = makeGenerator(1)
  const now = Date.now()
  const total = WARM_UP + SAVES
  const inputs = Array.from({ length: total }, () => gen.moment())
  // Raw rows are built beforehand: the raw figure is IndexedDB alone, the Dexie figure the whole app save.
  const indexedRows = Array.from({ length: total }, () => toStoredRow(gen.moment(), now))
  const plainRows = Array.from({ length: total }, () => toStoredRow(gen.moment(), now))
  const raw = await openRawDb()
  const dexie: number[] = []
  const rawIndexed: number[] = []
  const rawPlain: number[] = []
  // Interleaved, so drift over the run (GC, caches, other load) falls on all three alike.
  for (let i = 0; i < total; i++) {
    const d = await timed(() => createEntry(inputs[i]!))
    const r = await timed(() => rawPut(raw, 'indexed', indexedRows[i]!))
    const p = await timed(() => rawPut(raw, 'plain', plainRows[i]!))
    if (i < WARM_UP) continue
    dexie.push(d)
    rawIndexed.push(r)
    rawPlain.push(p)
  }
  raw.close()
  await deleteRawDb()
  const result = { count: SAVES, dexie: spread(dexie), rawIndexed: spread(rawIndexed), rawPlain: spread(rawPlain) }
  return { ...result, ratio: result.dexie.median / result.rawIndexed.median }
}

async function benchGenerate(end: number): Promise<BenchResults['generate']> {
  await db.entries.clear()
  const start = performance.now()
  const rows = makeGenerator(2).journal(JOURNAL_SIZE, end).map((input) => toStoredRow(input, end))
  const buildMs = performance.now() - start
  const bulkAddMs = await timed(() => db.entries.bulkAdd(rows))
  return {
    count: await db.entries.count(),
    moments: rows.filter((r) => r.kind === 'moment').length,
    tugs: rows.filter((r) => r.kind === 'tug').length,
    distinctWords: new Set(rows.flatMap((r) => r.words)).size,
    buildMs,
    bulkAddMs,
  }
}

function searchQueries(end: number): { label: string; filter: JournalFilter }[] {
  const lastDays = (n: number) => ({ from: end - n * DAY, to: end })
  return [
    { label: 'word: work', filter: { query: 'work' } },
    { label: 'word: sister', filter: { query: 'sister' } },
    { label: 'word: tired', filter: { query: 'tired' } },
    { label: 'prefix: ang', filter: { query: 'ang' } },
    { label: 'prefix: over', filter: { query: 'over' } },
    { label: 'prefix: st (broad)', filter: { query: 'st' } },
    { label: 'two words: work tired', filter: { query: 'work tired' } },
    { label: 'two words: sister dinner', filter: { query: 'sister dinner' } },
    { label: 'three words: anxious chest morning', filter: { query: 'anxious chest morning' } },
    { label: `rare word: ${RARE_WORDS[0]}`, filter: { query: RARE_WORDS[0] } },
    { label: `rare word: ${RARE_WORDS[4]}`, filter: { query: RARE_WORDS[4] } },
    { label: 'rung word: rehearse', filter: { query: 'rehearse' } },
    { label: 'rung word: boundaries', filter: { query: 'boundaries' } },
    { label: 'word + kind tug: work', filter: { query: 'work', kinds: ['tug'] } },
    { label: 'word + kind moment: sleep', filter: { query: 'sleep', kinds: ['moment'] } },
    { label: 'kind only: tug', filter: { kinds: ['tug'] } },
    { label: 'last 30 days', filter: lastDays(30) },
    { label: 'word + last 90 days: anxious', filter: { query: 'anxious', ...lastDays(90) } },
    { label: 'word + one year ago, 6 months: work', filter: { query: 'work', from: end - 365 * DAY, to: end - 182 * DAY } },
    { label: 'tag: family', filter: { tag: 'family' } },
    { label: 'no match: zebra', filter: { query: 'zebra' } },
  ]
}

async function benchSearch(end: number): Promise<BenchResults['search']> {
  const queries = searchQueries(end)
  const cold: number[] = []
  const hits: number[] = []
  for (const q of queries) {
    const start = performance.now()
    hits.push((await listJournal(q.filter)).length)
    cold.push(performance.now() - start)
  }
  const rounds: number[][] = queries.map(() => [])
  for (let r = 0; r < SEARCH_ROUNDS; r++) {
    for (const [i, q] of queries.entries()) rounds[i]!.push(await timed(() => listJournal(q.filter)))
  }
  const timings: QueryTiming[] = queries.map((q, i) => ({ label: q.label, hits: hits[i]!, ms: spread(rounds[i]!).median, coldMs: cold[i]! }))
  return { rounds: SEARCH_ROUNDS, queries: timings, warm: spread(timings.map((t) => t.ms)), cold: spread(cold) }
}

async function benchListAll(): Promise<BenchResults['listAll']> {
  const start = performance.now()
  const rows = (await listJournal({})).length
  const coldMs = performance.now() - start
  const warm: number[] = []
  for (let r = 0; r < LIST_ROUNDS; r++) warm.push(await timed(() => listJournal({})))
  return { rows, coldMs, warm: spread(warm) }
}

async function benchSavesWhenFull(): Promise<BenchResults['saveWhenFull']> {
  const gen = makeGenerator(3)
  const times: number[] = []
  for (let i = 0; i < SAVES_WHEN_FULL; i++) times.push(await timed(() => createEntry(gen.moment())))
  return spread(times)
}

async function runBench(): Promise<BenchResults> {
  await db.open()
  await db.entries.clear()
  const save = await benchSaves()
  const end = Date.now()
  const generate = await benchGenerate(end)
  await new Promise((resolve) => setTimeout(resolve, SETTLE_MS))
  const search = await benchSearch(end)
  const listAll = await benchListAll()
  const saveWhenFull = await benchSavesWhenFull()
  const estimate = await navigator.storage?.estimate?.()
  const results: BenchResults = { userAgent: navigator.userAgent, crossOriginIsolated, settleMs: SETTLE_MS, save, saveWhenFull, generate, search, listAll, storageBytes: estimate?.usage }
  window.__benchResults = results
  return results
}

window.runBench = runBench
if (new URLSearchParams(location.search).has('auto')) {
  runBench().catch((e: unknown) => {
    window.__benchError = String(e)
  })
}
