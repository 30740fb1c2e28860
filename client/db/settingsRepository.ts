import { dbNow, openDb } from './openDb'
import type { DeviceSettings, SettingKey, SettingRow } from './RungsDB'

export async function readSetting<K extends SettingKey>(key: K): Promise<DeviceSettings[K] | undefined> {
  const db = dbNow() ?? (await openDb())
  const row = (await db.settings.get(key)) as SettingRow<K> | undefined
  return row?.value
}

export async function writeSetting<K extends SettingKey>(key: K, value: DeviceSettings[K]): Promise<void> {
  const db = dbNow() ?? (await openDb())
  await db.settings.put({ key, value } as SettingRow)
}
