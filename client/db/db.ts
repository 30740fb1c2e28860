import Dexie, { liveQuery } from 'dexie'
import { dropJournalIndexOn } from './journalIndex'
import { announceDb } from './openDb'
import { RungsDB } from './RungsDB'

/**
 * The one Dexie instance of the app. Only tests import this module statically; the app reaches it through openDb.ts,
 * so Dexie stays out of the first screen's chunk.
 */
export const db = new RungsDB()

// Any change to the entries table, in this tab or another, makes the journal's in-memory index stale. Registered as the
// instance is made, before any liveQuery can subscribe; liveQuery re-runs asynchronously, so a re-run sees the drop.
Dexie.on('storagemutated', (parts) => dropJournalIndexOn(Object.keys(parts), db.name))

announceDb({ db, liveQuery })
