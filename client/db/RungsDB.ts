import Dexie, { type EntityTable } from 'dexie'
import type { RegionCode } from '@shared/content/crisisLines'

/** Settings kept on this device, one row per key. */
export interface DeviceSettings {
  /** The Help now region the person chose; absent until they choose (the locale guess is used meanwhile). */
  region: RegionCode
  /** Set at the first sign-in on this device; until then the app never calls the server. */
  signedInBefore: boolean
}
export type SettingKey = keyof DeviceSettings
export interface SettingRow<K extends SettingKey = SettingKey> {
  key: K
  value: DeviceSettings[K]
}

/** The device database. Schema changes only ever add a version(n + 1). */
export class RungsDB extends Dexie {
  settings!: EntityTable<SettingRow, 'key'>

  constructor(name = 'rungs') {
    super(name)
    this.version(1).stores({ settings: 'key' })
  }
}
