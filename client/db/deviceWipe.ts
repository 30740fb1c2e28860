import { dbNow, openDb } from './openDb'

/** localStorage keys Rungs writes; everything else in this browser's storage for the site is Dexie's. */
const RUNGS_KEY_PREFIX = 'rungs.'

/**
 * Deletes everything Rungs keeps in this browser: the whole Dexie database (journal, drafts, trash, outbox, links,
 * settings, app lock) and Rungs' localStorage keys. Cache Storage holds only the app's own code and stays, so the app
 * still opens offline afterwards. The caller reloads the page.
 */
export async function wipeDevice(): Promise<void> {
  const db = dbNow() ?? (await openDb())
  await db.delete()
  const storage = globalThis.localStorage
  if (!storage) return
  const keys: string[] = []
  for (let i = 0; i < storage.length; i++) {
    const key = storage.key(i)
    if (key?.startsWith(RUNGS_KEY_PREFIX)) keys.push(key)
  }
  for (const key of keys) storage.removeItem(key)
}
