import { readSetting, writeSetting } from './settingsRepository'

/**
 * Asks the browser to keep this site's storage under pressure (navigator.storage.persist). Asked once per device;
 * the answer is remembered so the notice on Settings can say whether it was granted.
 */
export async function requestPersistentStorage(): Promise<boolean> {
  if (await readSetting('storagePersisted')) return true
  const storage = globalThis.navigator?.storage
  if (!storage?.persist) return false
  const granted = (await storage.persisted?.()) || (await storage.persist().catch(() => false))
  await writeSetting('storagePersisted', granted)
  return granted
}
