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
  const raw = await rawDb()
  const out: Record<string, unknown> = {}
  const ordered = () => db.entries.orderBy('createdAt').reverse()
  out['A orderBy(createdAt).reverse().keys()  [cursor]'] = await t(() => ordered().keys())
  out['B orderBy(createdAt).reverse().primaryKeys()'] = await t(() => ordered().primaryKeys())
  out['C Promise.all(A, B) as listJournal does'] = await t(() => Promise.all([ordered().keys(), ordered().primaryKeys()]))
  out['D forward keys() (cursor)'] = await t(() => db.entries.orderBy('createdAt').keys())
  out['E Dexie eachKey one cursor, key+primaryKey'] = await t(async () => { const k: unknown[] = []; const p: unknown[] = []; await ordered().eachKey((key, c) => { k.push(key); p.push(c.primaryKey) }) })
  out['F raw openKeyCursor prev, key+primaryKey'] = await t(() => new Promise<void>((res, rej) => {
    const k: unknown[] = []; const p: unknown[] = []
    const r = raw.transaction('entries').objectStore('entries').index('createdAt').openKeyCursor(null, 'prev')
    r.onsuccess = () => { const c = r.result; if (!c) return res(); k.push(c.key); p.push(c.primaryKey); c.continue() }
    r.onerror = () => rej(r.error)
  }))
  out['G raw index.getAllKeys (primary keys, forward)'] = await t(() => req(raw.transaction('entries').objectStore('entries').index('createdAt').getAllKeys()))
  const store = raw.transaction('entries').objectStore('entries') as IDBObjectStore & { index(n: string): IDBIndex & { getAllRecords?: (o: object) => IDBRequest } }
  out['H getAllRecords available'] = typeof store.index('createdAt').getAllRecords === 'function'
  out['I raw getAllRecords prev on createdAt (values too)'] = await t(() => req((raw.transaction('entries').objectStore('entries').index('createdAt') as any).getAllRecords({ direction: 'prev' })), 3)
  out['J db.entries.toArray() (all rows)'] = await t(() => db.entries.toArray(), 3)
  for (const w of ['work', 'st', 'sister', 'lighthouse', 'rehearse']) {
    out[`K words startsWith(${w}).primaryKeys()`] = await t(() => db.entries.where('words').startsWith(w).primaryKeys())
    out[`K'  ...+ new Set (size)`] = (await db.entries.where('words').startsWith(w).primaryKeys()).length
  }
  out['L kind anyOf(tug).primaryKeys()'] = await t(() => db.entries.where('kind').anyOf(['tug']).primaryKeys())
  out['M tags equals(family).primaryKeys()'] = await t(() => db.entries.where('tags').equals('family').primaryKeys())
  const wset = new Set((await db.entries.where('words').startsWith('work').primaryKeys()) as string[])
  const [times, ids] = await Promise.all([ordered().keys(), ordered().primaryKeys()])
  out['N JS loop over 10 000 with Set.has'] = await t(async () => { const r = []; for (let i = 0; i < ids.length; i++) if (wset.has(ids[i] as string)) r.push({ id: ids[i], createdAt: times[i] }) })
  for (const q of ['work', 'lighthouse', 'sister dinner', 'st']) {
    out[`P listJournal(${q})`] = await t(() => listJournal({ query: q }))
    out[`Q candidate bulkGet(${q})`] = await t(() => candidateBulkGet({ query: q }))
  }
  out['R listJournal({})'] = await t(() => listJournal({}))
  return out
}
;(window as any).runDiag = run
