import { defineStore } from 'pinia'
import { Dark } from 'quasar'
import { computed, ref } from 'vue'
import type { RegionCode } from '@shared/content/crisisLines'
import { guessRegion } from '@shared/content/guessRegion'
import { readSetting, writeSetting } from '@/db/settingsRepository'

export type Appearance = 'auto' | 'light' | 'dark'
// Appearance is a trivial UI preference, so it may live in localStorage and apply before the database opens.
const APPEARANCE_KEY = 'rungs.appearance'

function readAppearance(): Appearance {
  const v = globalThis.localStorage?.getItem(APPEARANCE_KEY)
  return v === 'light' || v === 'dark' ? v : 'auto'
}

/** Choices kept on this device: the Help now region and the appearance. */
export const useDeviceSettingsStore = defineStore('deviceSettings', () => {
  const chosenRegion = ref<RegionCode | undefined>()
  const guessedRegion = guessRegion(typeof navigator === 'undefined' ? [] : [...(navigator.languages ?? []), navigator.language].filter(Boolean))
  const appearance = ref<Appearance>(readAppearance())

  /** The region Help now shows: the chosen one, else the locale guess, else the EU's 112. */
  const region = computed<RegionCode>(() => chosenRegion.value ?? guessedRegion ?? 'EU')
  const regionIsGuess = computed(() => chosenRegion.value === undefined)

  async function load(): Promise<void> {
    chosenRegion.value = await readSetting('region')
  }

  async function setRegion(code: RegionCode): Promise<void> {
    chosenRegion.value = code
    await writeSetting('region', code)
  }

  function applyAppearance(): void {
    Dark.set(appearance.value === 'auto' ? 'auto' : appearance.value === 'dark')
  }

  function setAppearance(value: Appearance): void {
    appearance.value = value
    if (value === 'auto') globalThis.localStorage?.removeItem(APPEARANCE_KEY)
    else globalThis.localStorage?.setItem(APPEARANCE_KEY, value)
    applyAppearance()
  }

  return { region, regionIsGuess, guessedRegion, appearance, load, setRegion, setAppearance, applyAppearance }
})
