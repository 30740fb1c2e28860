import type { Entry } from '@shared/schemas/entry.schema'
import { dbNow, openDb } from './openDb'
import { fromStored } from './entriesRepository'
import { loadEntrySchemas } from './entrySchemas'
import { entryWords } from './entryWords'
import type { StoredEntry } from './RungsDB'
import { readSetting, writeSetting } from './settingsRepository'

const DAY_MS = 24 * 60 * 60 * 1000
/** How long after the last backup the reminder comes back. */
export const BACKUP_REMIND_AFTER_MS = 14 * DAY_MS
/** How long "Not now" keeps the reminder away. */
export const BACKUP_SNOOZE_MS = 7 * DAY_MS

export interface MergeResult {
  /** Entries this device did not have. */
  added: number
  /** Entries this device had in an older version. */
  updated: number
  /** Entries this device already had in the same or a newer version. */
  skipped: number
}

/** Every entry on this device in the shared Entry shape (no search words), oldest first. */
export async function allEntriesForBackup(): Promise<Entry[]> {
  const db = dbNow() ?? (await openDb())
  return (await db.entries.orderBy('createdAt').toArray()).map(fromStored)
}

/** Keeps the highest version of each id, so a file that lists an entry twice is counted once. */
function newestById(entries: Entry[]): Entry[] {
  const byId = new Map<string, Entry>()
  for (const entry of entries) {
    const seen = byId.get(entry.id)
    if (!seen || entry.version > seen.version) byId.set(entry.id, entry)
  }
  return [...byId.values()]
}

/**
 * Brings backed-up entries into this device's journal in one transaction: a new id is added, a higher version replaces
 * the entry here, the same or a lower version is left alone. Nothing is ever deleted. Every restored entry comes back
 * private with nothing queued (DESIGN.md, Data), so restoring never sends anything to a therapist. Importing the same
 * file again changes nothing.
 */
export async function mergeBackup(entries: Entry[]): Promise<MergeResult> {
  const db = dbNow() ?? (await openDb())
  const { entrySchema } = await loadEntrySchemas()
  const incoming = newestById(entries.map((e) => entrySchema.parse(e)))
  return db.transaction('rw', db.entries, async () => {
    const current = await db.entries.bulkGet(incoming.map((e) => e.id))
    const rows: StoredEntry[] = []
    const result: MergeResult = { added: 0, updated: 0, skipped: 0 }
    incoming.forEach((entry, i) => {
      const here = current[i]
      if (here && here.version >= entry.version) {
        result.skipped++
        return
      }
      if (here) result.updated++
      else result.added++
      rows.push({ ...entry, shares: [], words: entryWords(entry) })
    })
    await db.entries.bulkPut(rows)
    return result
  })
}

export interface BackupReminderState {
  /** Whether the calm reminder should show now. */
  due: boolean
  lastBackupAt?: number
}

/**
 * Whether to remind about a backup: there is something to lose, no backup in the last 14 days (or ever), and the
 * reminder was not put aside in the last 7. Reads entries and settings, so a liveQuery re-runs when either changes.
 */
export async function backupReminderState(now = Date.now()): Promise<BackupReminderState> {
  const db = dbNow() ?? (await openDb())
  const [count, lastBackupAt, snoozedAt] = await Promise.all([
    db.entries.count(),
    readSetting('lastBackupAt'),
    readSetting('backupReminderSnoozedAt'),
  ])
  const backupStale = lastBackupAt === undefined || now - lastBackupAt >= BACKUP_REMIND_AFTER_MS
  const snoozed = snoozedAt !== undefined && now - snoozedAt < BACKUP_SNOOZE_MS
  return { due: count > 0 && backupStale && !snoozed, lastBackupAt }
}

export async function snoozeBackupReminder(now = Date.now()): Promise<void> {
  await writeSetting('backupReminderSnoozedAt', now)
}
