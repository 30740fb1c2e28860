import { whenIdle } from '@/utils/whenIdle'
import type { liveQuery as LiveQuery } from 'dexie'
import type { RungsDB } from './RungsDB'
import { probeNoDatabase } from './startupHints'

/** What the Dexie chunk (db/db.ts) hands over once it has loaded. */
export interface LoadedDb {
  db: RungsDB
  liveQuery: typeof LiveQuery
}

let loaded: LoadedDb | undefined
let loading: Promise<LoadedDb> | undefined

/** Called by db/db.ts as it loads, however it was imported (tests import it directly). */
export function announceDb(d: LoadedDb): void {
  loaded = d
}

/**
 * The Dexie instance once its chunk has loaded. Repositories write `dbNow() ?? (await openDb())`, so code running inside
 * a Dexie transaction or liveQuery (where the chunk is always loaded) never awaits anything but IndexedDB.
 */
export function dbNow(): RungsDB | undefined {
  return loaded?.db
}

/**
 * Dexie is about a fifth of the app's first-screen code and is loaded with import(). On a browser that holds no Rungs
 * database yet (a first visit, or after a wipe) there is nothing to read, so the first screen paints with its empty
 * defaults and Dexie follows when the page is idle (at the latest after 2 s), or at once when the person first taps or
 * types, so what they write is never waiting on a timer; otherwise it is fetched at once.
 */
function firstIdleOrInput(): Promise<void> {
  return new Promise((resolve) => {
    whenIdle(resolve, 2_000, 300)
    for (const type of ['pointerdown', 'keydown']) globalThis.addEventListener?.(type, () => resolve(), { once: true, capture: true, passive: true })
  })
}

export function loadDb(): Promise<LoadedDb> {
  if (loaded) return Promise.resolve(loaded)
  loading ??= (async () => {
    if (await probeNoDatabase()) await firstIdleOrInput()
    await import('./db')
    return loaded!
  })()
  return loading
}

export async function openDb(): Promise<RungsDB> {
  return (await loadDb()).db
}
