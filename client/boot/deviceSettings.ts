import { useDeviceSettingsStore } from '@/stores/deviceSettings'

/** Loads the Help now region from the device; until it loads, the locale guess is shown. */
export function bootDeviceSettings(): void {
  void useDeviceSettingsStore().load()
}
