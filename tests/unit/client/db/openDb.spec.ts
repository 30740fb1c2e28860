import { afterEach, describe, expect, it, vi } from 'vitest'

// Each test loads openDb.ts afresh (its state is per page load) against fake-indexeddb, which answers
// indexedDB.databases() as a browser does.
async function freshOpenDb() {
  vi.resetModules()
  return import('@/db/openDb')
}

function holdIdleCallbacks(): (() => void)[] {
  const held: (() => void)[] = []
  vi.stubGlobal('requestIdleCallback', (run: () => void) => held.push(run))
  return held
}

const settle = () => new Promise((resolve) => setTimeout(resolve, 20))

describe('loading the device database (db/openDb.ts)', () => {
  afterEach(() => {
    vi.unstubAllGlobals()
  })

  it('on a browser with no Rungs database yet, loads Dexie only once the page is idle', async () => {
    const held = holdIdleCallbacks()
    const { loadDb, dbNow } = await freshOpenDb()
    let done = false
    const loading = loadDb().then((d) => (done = true) && d)
    await settle()
    expect(done).toBe(false)
    expect(dbNow()).toBeUndefined()
    expect(held).toHaveLength(1)
    held[0]!()
    const { db } = await loading
    expect(dbNow()).toBe(db)
    expect(db.name).toBe('rungs')
    // Opened and usable: the first write creates the database.
    await db.settings.put({ key: 'firstRunSeenAt', value: 1 })
    expect((await indexedDB.databases()).map((d) => d.name)).toContain('rungs')
  })

  it('on a first visit, loads Dexie as soon as the person types, without waiting for idle', async () => {
    await new Promise((resolve) => (indexedDB.deleteDatabase('rungs').onsuccess = resolve))
    const held = holdIdleCallbacks()
    const { loadDb } = await freshOpenDb()
    let done = false
    const loading = loadDb().then((d) => (done = true) && d)
    await settle()
    expect(done).toBe(false)
    window.dispatchEvent(new KeyboardEvent('keydown', { key: 'a' }))
    const { db } = await loading
    expect(db.name).toBe('rungs')
    expect(held).toHaveLength(1)
  })

  it('when the database exists, loads Dexie at once, and every caller gets the same instance', async () => {
    const opened = indexedDB.open('rungs')
    await new Promise((resolve) => (opened.onsuccess = resolve))
    opened.result.close()
    const held = holdIdleCallbacks()
    const { loadDb, openDb, dbNow } = await freshOpenDb()
    const [a, b] = await Promise.all([openDb(), openDb()])
    expect(held).toHaveLength(0)
    expect(a).toBe(b)
    expect(dbNow()).toBe(a)
    expect((await loadDb()).db).toBe(a)
  })
})
