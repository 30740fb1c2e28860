import { useDeviceSettingsStore } from '@/stores/deviceSettings'

/** Dark mode follows the device unless the person chose light or dark. */
export function bootAppearance(): void {
  useDeviceSettingsStore().applyAppearance()
}
