// Reads the server's SQLite file directly with sqlite3, once the server process has stopped.
import sqlite3 from 'sqlite3'

export async function readSqlite<T>(file: string, read: (all: (sql: string) => Promise<T[]>) => Promise<void>): Promise<void> {
  const db = await new Promise<sqlite3.Database>((resolve, reject) => {
    const d = new sqlite3.Database(file, (err) => (err ? reject(err) : resolve(d)))
  })
  const all = (sql: string) => new Promise<T[]>((resolve, reject) => db.all(sql, (err: Error | null, rows: T[]) => (err ? reject(err) : resolve(rows))))
  try {
    await read(all)
  } finally {
    await new Promise<void>((resolve) => db.close(() => resolve()))
  }
}

export interface StoredShare {
  linkId: string
  entryId: string
  version: number
}

/** Every shared_entries row (as linkId, entryId, version) and the result of `PRAGMA integrity_check`. */
export async function storedShares(file: string): Promise<{ rows: StoredShare[]; integrity: string }> {
  let rows: StoredShare[] = []
  let integrity = ''
  await readSqlite<Record<string, unknown>>(file, async (all) => {
    rows = (await all('SELECT linkId, entryId, version FROM shared_entries')) as unknown as StoredShare[]
    integrity = (await all('PRAGMA integrity_check')).map((r) => String(Object.values(r)[0])).join('; ')
  })
  return { rows, integrity }
}

/**
 * Compares what the clients were told was stored with what the database holds: a pair is lost when it is missing or
 * below the highest version acknowledged with a 200, and duplicated when it has more than one row.
 */
export function compareShares(expected: Map<string, number>, rows: StoredShare[]) {
  const seen = new Map<string, number[]>()
  for (const r of rows) {
    const key = `${r.linkId}:${r.entryId}`
    seen.set(key, [...(seen.get(key) ?? []), r.version])
  }
  let lost = 0
  let duplicated = 0
  let exact = 0
  let ahead = 0
  for (const [key, version] of expected) {
    const got = seen.get(key)
    if (!got || Math.max(...got) < version) lost++
    else if (Math.max(...got) === version) exact++
    else ahead++
  }
  for (const versions of seen.values()) if (versions.length > 1) duplicated += versions.length - 1
  const unexpected = [...seen.keys()].filter((k) => !expected.has(k)).length
  return { lost, duplicated, exact, ahead, unexpected, distinct: seen.size }
}
