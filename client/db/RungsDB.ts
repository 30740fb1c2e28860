import Dexie, { type EntityTable } from 'dexie'
import type { RegionCode } from '@shared/content/crisisLines'
import type { Entry } from '@shared/schemas/entry.schema'
import type { EarlierScoreView } from '@shared/schemas/measure.schema'
import type { PersonLinkRow } from '@shared/schemas/link.schema'
import type { LockIdleMinutes } from '@shared/schemas/appLock.schema'

/** Settings kept on this device, one row per key. */
export interface DeviceSettings {
  /** The Help now region the person chose; absent until they choose (the locale guess is used meanwhile). */
  region: RegionCode
  /** Set at the first sign-in on this device; until then the app never calls the server. */
  signedInBefore: boolean
  /** When the person acknowledged the "your journal lives only on this device" notice. */
  firstRunSeenAt: number
  /** When the last backup file was made; drives the occasional reminder. */
  lastBackupAt: number
  /** When the backup reminder was last put aside. */
  backupReminderSnoozedAt: number
  /** Whether the browser granted persistent storage, as last asked. */
  storagePersisted: boolean
  /** "Things I want to bring up" on the appointment summary, kept between visits. */
  summaryBringUp: string[]
  /** The app lock, when turned on: a PBKDF2 hash of the passcode with its salt, never the passcode. */
  appLock: AppLockRecord
  /** Wrong passcodes in a row, so the growing wait survives a reload. */
  appLockFailures: { count: number; lastAt: number }
}

export interface AppLockRecord {
  /** PBKDF2-SHA-256 of the passcode, base64. */
  hash: string
  salt: string
  iterations: number
  /** Only digits: the lock screen offers a number pad. */
  digits: boolean
  idleMinutes: LockIdleMinutes
  setAt: number
}
export type SettingKey = keyof DeviceSettings
export interface SettingRow<K extends SettingKey = SettingKey> {
  key: K
  value: DeviceSettings[K]
}

/** An entry as stored: the shared Entry plus the words the search index uses. */
export interface StoredEntry extends Entry {
  words: string[]
}

/** A deleted entry, kept a while so Undo can bring it back. */
export interface TrashedEntry {
  id: string
  entry: StoredEntry
  deletedAt: number
}

/** Unsaved writing, saved as the person types, so a reload or crash loses nothing. */
export interface Draft {
  /** 'moment:new', 'tug:new', 'edit:<entry id>', or 'safetyPlan'. */
  id: string
  kind: 'moment' | 'tug' | 'safetyPlan'
  /** The entry being edited, when this draft edits one. */
  entryId?: string
  /** The fields typed so far, in the entry's own shape. */
  data: Partial<Omit<Entry, 'id' | 'version' | 'shares' | 'updatedAt'>>
  /** Where in the tug flow the person was. */
  step?: string
  updatedAt: number
}

/**
 * One pending send of a share, ONE row per entry and link (id `${entryId}:${linkId}`): a newer op or version replaces the
 * older, so repeated edits coalesce instead of piling up.
 */
export interface OutboxRow {
  id: string
  entryId: string
  linkId: string
  op: 'put' | 'delete'
  /** The entry version this op is for. */
  version: number
  attempts: number
  nextAttemptAt: number
  /** Set after the last automatic attempt; the row stays until the person retries. */
  failed?: boolean
  /** Plain words for the person; never entry text. */
  lastError?: string
}

/** A copy of one of the person's links, for showing sharing offline. */
export interface StoredLink extends PersonLinkRow {
  syncedAt: number
}

/** An earlier score the therapist entered (e.g. intake on paper), cached so the history shows offline. */
export interface StoredEarlierScore extends EarlierScoreView {
  linkId: string
  syncedAt: number
}

/** The device database. Schema changes only ever add a version(n + 1). */
export class RungsDB extends Dexie {
  settings!: EntityTable<SettingRow, 'key'>
  entries!: EntityTable<StoredEntry, 'id'>
  drafts!: EntityTable<Draft, 'id'>
  trash!: EntityTable<TrashedEntry, 'id'>
  outbox!: EntityTable<OutboxRow, 'id'>
  links!: EntityTable<StoredLink, 'id'>
  earlierScores!: EntityTable<StoredEarlierScore, 'id'>

  constructor(name = 'rungs') {
    super(name)
    this.version(1).stores({ settings: 'key' })
    this.version(2).stores({
      entries: 'id, createdAt, updatedAt, kind, *tags, *words',
      drafts: 'id, updatedAt',
      trash: 'id, deletedAt',
    })
    this.version(3).stores({
      outbox: 'id, [entryId+linkId], nextAttemptAt',
      links: 'id',
    })
    this.version(4).stores({ earlierScores: 'id, linkId' })
  }
}
