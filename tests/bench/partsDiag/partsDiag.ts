import { db } from '@/db/db'
import { listJournal, type JournalFilter } from '@/db/entriesRepository'
import { entryWords } from '@/db/entryWords'
import type { StoredEntry } from '@/db/RungsDB'
import { searchWords } from '@shared/content/searchWords'
import { entrySchema, type Entry, type EntryInput } from '@shared/schemas/entry.schema'
import { makeGenerator } from '../browser/benchEntries'

function toStoredRow(input: EntryInput, now: number): StoredEntry {
  const entry: Entry = { ...input, id: crypto.randomUUID(), createdAt: input.createdAt ?? now, updatedAt: input.createdAt ?? now, version: 1, shares: [] }
  return { ...entrySchema.parse(entry), words: entryWords(entry) }
}
const med = (a: number[]) => [...a].sort((x, y) => x - y)[Math.floor(a.length / 2)]!
async function t(fn: () => Promise<unknown>, n = 5): Promise<number> {
  await fn()
  const s: number[] = []
  for (let i = 0; i < n; i++) { const a = performance.now(); await fn(); s.push(performance.now() - a) }
  return +med(s).toFixed(2)
}
function rawDb(): Promise<IDBDatabase> {
  return new Promise((res, rej) => { const r = indexedDB.open('rungs'); r.onsuccess = () => res(r.result); r.onerror = () => rej(r.error) })
}
function req<T>(r: IDBRequest<T>): Promise<T> { return new Promise((res, rej) => { r.onsuccess = () => res(r.result); r.onerror = () => rej(r.error) }) }

// Candidate: ids from the words index as now, but times only for the matches (bulkGet) when few match,
// and one native reverse key cursor (no Dexie per-step promise) when many match or none is wanted.
async function candidateBulkGet(filter: JournalFilter) {
  const sets: Set<string>[] = []
  for (const w of searchWords(filter.query)) sets.push(new Set((await db.entries.where('words').startsWith(w).primaryKeys()) as string[]))
  const first = sets.sort((a, b) => a.size - b.size)[0]
  const wanted = first ? [...first].filter((k) => sets.every((s) => s.has(k))) : []
  const rows = await db.entries.bulkGet(wanted)
  return rows.map((r) => ({ id: r!.id, createdAt: r!.createdAt })).sort((a, b) => b.createdAt - a.createdAt)
}

async function run() {
  await db.open()
  await db.entries.clear()
  const end = Date.now()
  const rows = makeGenerator(2).journal(10_000, end).map((i) => toStoredRow(i, end))
  await db.entries.bulkAdd(rows)
  const out: Record<string, unknown> = {}
  await new Promise((r) => setTimeout(r, 15000))
  const queries: JournalFilter[] = [
    { query: 'work' }, { query: 'sister' }, { query: 'tired' }, { query: 'ang' }, { query: 'over' }, { query: 'st' },
    { query: 'work tired' }, { query: 'sister dinner' }, { query: 'anxious chest morning' }, { query: 'lighthouse' }, { query: 'quokka' },
    { query: 'rehearse' }, { query: 'boundaries' }, { query: 'work', kinds: ['tug'] }, { query: 'sleep', kinds: ['moment'] }, { kinds: ['tug'] },
    { from: end - 30 * 864e5, to: end }, { query: 'anxious', from: end - 90 * 864e5, to: end }, { query: 'work', from: end - 365 * 864e5, to: end - 182 * 864e5 },
    { tag: 'family' }, { query: 'zebra' },
  ]
  const summary = (xs: number[]) => { const s = [...xs].sort((a, b) => a - b); return `median ${s[Math.floor(s.length / 2)]!.toFixed(2)} / p95 ${s[Math.ceil(0.95 * s.length) - 1]!.toFixed(2)} / max ${s[s.length - 1]!.toFixed(2)}` }
  const same = async (f: JournalFilter, mine: { id: string; createdAt: number }[]) => {
    const ref = await listJournal(f)
    return ref.length === mine.length && ref.every((r, i) => r.id === mine[i]!.id && r.createdAt === mine[i]!.createdAt)
  }
  // Current.
  const cur: number[] = []
  for (const q of queries) cur.push(await t(() => listJournal(q), 3))
  out['current listJournal, 21 queries'] = summary(cur)
  out['current listJournal({})'] = await t(() => listJournal({}), 3)
  // Minimal: one cursor instead of two, and bulkGet the matches when few.
  const minimal = async (f: JournalFilter) => {
    const sets: Set<string>[] = []
    for (const w of searchWords(f.query)) sets.push(new Set((await db.entries.where('words').startsWith(w).primaryKeys()) as string[]))
    if (f.kinds?.length) sets.push(new Set((await db.entries.where('kind').anyOf(f.kinds).primaryKeys()) as string[]))
    if (f.tag) sets.push(new Set((await db.entries.where('tags').equals(f.tag).primaryKeys()) as string[]))
    let wanted: Set<string> | undefined
    if (sets.length) { const [first, ...rest] = sets.sort((a, b) => a.size - b.size); wanted = new Set([...first!].filter((k) => rest.every((x) => x.has(k)))) }
    if (wanted && !wanted.size) return []
    const from = f.from ?? 0, to = f.to ?? Number.MAX_SAFE_INTEGER
    if (wanted && wanted.size <= 1000) {
      const got = await db.entries.bulkGet([...wanted])
      return got.filter((r) => r && r.createdAt >= from && r.createdAt <= to).map((r) => ({ id: r!.id, createdAt: r!.createdAt })).sort((a, b) => b.createdAt - a.createdAt || (a.id < b.id ? 1 : -1))
    }
    const range = f.from !== undefined || f.to !== undefined ? db.entries.where('createdAt').between(from, to, true, true) : db.entries.orderBy('createdAt')
    const rows: { id: string; createdAt: number }[] = []
    await range.reverse().eachKey((key, c) => { const id = c.primaryKey as string; if (!wanted || wanted.has(id)) rows.push({ id, createdAt: key as number }) })
    return rows
  }
  const min: number[] = []
  let minSame = 0
  for (const q of queries) { min.push(await t(() => minimal(q), 3)); if (await same(q, await minimal(q))) minSame++ }
  out['minimal (one cursor; bulkGet when <= 1000 match), 21 queries'] = summary(min)
  out['minimal: results identical to listJournal'] = `${minSame} / ${queries.length}`
  out['minimal listJournal({})'] = await t(() => minimal({}), 3)

  // In memory: one read of all rows into compact arrays; queries answered in JS.
  let mem: { ids: string[]; times: number[]; kinds: string[]; tags: string[][]; words: string[]; post: number[][] } | undefined
  const buildMem = async () => {
    const all = (await db.entries.toArray()).sort((a, b) => b.createdAt - a.createdAt || (a.id < b.id ? 1 : -1))
    const byWord = new Map<string, number[]>()
    all.forEach((r, i) => { for (const w of r.words) { let l = byWord.get(w); if (!l) byWord.set(w, (l = [])); l.push(i) } })
    const words = [...byWord.keys()].sort()
    mem = { ids: all.map((r) => r.id), times: all.map((r) => r.createdAt), kinds: all.map((r) => r.kind), tags: all.map((r) => r.tags), words, post: words.map((w) => byWord.get(w)!) }
  }
  const lower = (arr: string[], x: string) => { let lo = 0, hi = arr.length; while (lo < hi) { const m = (lo + hi) >> 1; if (arr[m]! < x) lo = m + 1; else hi = m } return lo }
  const inMemory = async (f: JournalFilter) => {
    await db.entries.count()
    if (!mem) await buildMem()
    const m = mem!
    const n = m.ids.length
    const terms = searchWords(f.query)
    const mark = new Uint8Array(n)
    terms.forEach((w, t) => {
      for (let j = lower(m.words, w); j < m.words.length && m.words[j]!.startsWith(w); j++) for (const i of m.post[j]!) if (mark[i] === t) mark[i] = t + 1
    })
    const from = f.from ?? 0, to = f.to ?? Number.MAX_SAFE_INTEGER
    const rows: { id: string; createdAt: number }[] = []
    for (let i = 0; i < n; i++) {
      if (mark[i] !== terms.length) continue
      const time = m.times[i]!
      if (time < from || time > to) continue
      if (f.kinds?.length && !f.kinds.includes(m.kinds[i] as never)) continue
      if (f.tag && !m.tags[i]!.includes(f.tag)) continue
      rows.push({ id: m.ids[i]!, createdAt: time })
    }
    return rows
  }
  out['in-memory: db.entries.count() alone (what keeps liveQuery subscribed)'] = await t(() => db.entries.count())
  const b0 = performance.now(); await buildMem(); out['in-memory: build (toArray + postings)'] = +(performance.now() - b0).toFixed(1)
  const memT: number[] = []
  let memSame = 0
  for (const q of queries) { memT.push(await t(() => inMemory(q), 3)); if (await same(q, await inMemory(q))) memSame++ }
  out['in-memory, 21 queries (count() included)'] = summary(memT)
  out['in-memory: results identical to listJournal'] = `${memSame} / ${queries.length}`
  out['in-memory listJournal({})'] = await t(() => inMemory({}), 3)
  return out
}
;(window as any).runDiag = run
