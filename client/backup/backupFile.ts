import { format as formatDate } from 'date-fns'
import {
  BACKUP_FORMAT,
  BACKUP_FORMAT_VERSION,
  BACKUP_MAX_CHARS,
  backupFileSchema,
  backupHeaderSchema,
  backupPassphraseSchema,
  type BackupPayload,
  type UnlockedBackupFile,
} from '@shared/schemas/backup.schema'
import type { Entry } from '@shared/schemas/entry.schema'
import { allEntriesForBackup, mergeBackup, type MergeResult } from '@/db/backupRepository'
import { writeSetting } from '@/db/settingsRepository'
import { BACKUP_ITERATIONS, BackupError, describeIssue, lockBackup, unlockBackup, type UnlockOptions } from './backupCrypto'

export interface MakeBackupOptions {
  /** Locks the file; required unless `unlocked` is true. */
  passphrase?: string
  /** Writes a file anyone can read. Only when asked for explicitly. */
  unlocked?: boolean
  /** Only tests lower this, to stay fast; the app always uses the default. */
  iterations?: number
}

export interface MadeBackup {
  /** rungs-backup-YYYY-MM-DD.json, in local time. */
  fileName: string
  /** The JSON text to save. */
  text: string
  entryCount: number
  locked: boolean
}

export interface ReadBackup {
  exportedAt: number
  entries: Entry[]
  locked: boolean
}

export interface RestoredBackup extends MergeResult {
  exportedAt: number
}

export function backupFileName(at: number): string {
  return `${BACKUP_FORMAT}-${formatDate(at, 'yyyy-MM-dd')}.json`
}

/**
 * Builds the backup file of every entry on this device: locked with the passphrase unless `unlocked: true` is given,
 * and notes the time in settings so the backup reminder can rest.
 */
export async function makeBackupFile(options: MakeBackupOptions, now = Date.now()): Promise<MadeBackup> {
  const unlocked = options.unlocked === true
  if (!unlocked) {
    if (!options.passphrase) throw new BackupError('passphrase_needed', 'Choose a passphrase to lock the backup file.')
    if (!backupPassphraseSchema.safeParse(options.passphrase).success) {
      throw new BackupError('passphrase_too_short', 'Use a passphrase of at least 8 characters.')
    }
  }
  const payload: BackupPayload = { exportedAt: now, entries: await allEntriesForBackup() }
  const file = unlocked
    ? ({ format: BACKUP_FORMAT, formatVersion: BACKUP_FORMAT_VERSION, locked: false, ...payload } satisfies UnlockedBackupFile)
    : await lockBackup(payload, options.passphrase!, options.iterations ?? BACKUP_ITERATIONS)
  const text = JSON.stringify(file, null, unlocked ? 2 : undefined)
  await writeSetting('lastBackupAt', now)
  return { fileName: backupFileName(now), text, entryCount: payload.entries.length, locked: !unlocked }
}

/**
 * Reads a backup file's text and returns its entries, unlocking it with the passphrase when it is locked. Every entry is
 * checked against the entry schema. Throws a BackupError with a plain message for anything wrong; never touches the
 * database.
 */
export async function readBackupFile(text: string, passphrase?: string, options: UnlockOptions = {}): Promise<ReadBackup> {
  if (text.length > BACKUP_MAX_CHARS) {
    throw new BackupError('too_large', 'This file is larger than any Rungs backup (the limit is 20 MB).')
  }
  let json: unknown
  try {
    json = JSON.parse(text)
  } catch {
    throw new BackupError('not_json', 'This file is not a Rungs backup: it is not a JSON file, or it was cut short.')
  }
  const header = backupHeaderSchema.safeParse(json)
  if (!header.success) {
    const isOurs = typeof json === 'object' && json !== null && (json as { format?: unknown }).format === BACKUP_FORMAT
    if (!isOurs) throw new BackupError('not_rungs_backup', 'This file is not a Rungs backup. Choose a file Rungs made.')
    throw new BackupError('damaged', 'This file is damaged, so it cannot be restored: its version number is missing.')
  }
  if (header.data.formatVersion > BACKUP_FORMAT_VERSION) {
    throw new BackupError('newer_version', 'This backup was made by a newer version of Rungs. Update Rungs on this device, then try again.')
  }
  const file = backupFileSchema.safeParse(json)
  if (!file.success) {
    throw new BackupError('damaged', `This file is damaged, so it cannot be restored: ${describeIssue(file.error.issues[0]?.path ?? [])}.`)
  }
  if (!file.data.locked) return { exportedAt: file.data.exportedAt, entries: file.data.entries, locked: false }
  if (!passphrase) throw new BackupError('passphrase_needed', 'This backup is locked. Type the passphrase it was made with.')
  const payload = await unlockBackup(file.data, passphrase, options)
  return { exportedAt: payload.exportedAt, entries: payload.entries, locked: true }
}

/**
 * Reads a backup file and merges it into this device's journal (see mergeBackup). When the file cannot be read, it
 * throws before anything is written.
 */
export async function restoreBackupFile(text: string, passphrase?: string, options: UnlockOptions = {}): Promise<RestoredBackup> {
  const backup = await readBackupFile(text, passphrase, options)
  const result = await mergeBackup(backup.entries)
  return { ...result, exportedAt: backup.exportedAt }
}

const countEntries = (n: number) => `${n} ${n === 1 ? 'entry' : 'entries'}`

/** "12 entries added, 3 updated, 2 already here" (no full stop); the parts that are zero are left out. */
export function describeRestore({ added, updated, skipped }: MergeResult): string {
  const parts = ([[added, 'added'], [updated, 'updated'], [skipped, 'already here']] as const).filter(([n]) => n > 0)
  if (!parts.length) return 'The file held no entries'
  return parts.map(([n, what], i) => (i === 0 ? `${countEntries(n)} ${what}` : `${n} ${what}`)).join(', ')
}
