import { db } from './db'
import type { DeviceSettings, SettingKey, SettingRow } from './RungsDB'

export async function readSetting<K extends SettingKey>(key: K): Promise<DeviceSettings[K] | undefined> {
  const row = (await db.settings.get(key)) as SettingRow<K> | undefined
  return row?.value
}

export async function writeSetting<K extends SettingKey>(key: K, value: DeviceSettings[K]): Promise<void> {
  await db.settings.put({ key, value } as SettingRow)
}
