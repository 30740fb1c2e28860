import { watch } from 'vue'
import { startupFact } from '@/db/startupHints'
import { useAppLockStore } from '@/stores/appLock'
import { whenIdle } from '@/utils/whenIdle'

/**
 * The lock screen (with its Help now and safety plan) as its own chunk. It is fetched before the app mounts when the
 * app starts locked, so it paints in the first render, and while the page is idle once the lock is on, so an idle lock
 * later never waits for the network; a device without a lock never needs it on the first screen.
 */
export const loadLockScreen = () => import('@/components/AppLockScreen.vue')
// With it, the code that checks a passcode (db/appLockRepository.ts loads it on first use), so unlocking never waits either.
const warmLock = () => Promise.all([loadLockScreen(), import('@/backup/backupCrypto')]).catch(() => undefined)

/**
 * Decides the app lock before the app mounts, so a person's page never paints before the lock covers it. When the
 * start-up hint says no lock is set (it was mirrored at the last read or change), or the browser has no Rungs database
 * yet, the app mounts at once and Dexie confirms just after; with a lock, or when unsure, Dexie decides first. If the
 * device database cannot be read, the journal cannot be read either, so the app starts without a lock.
 */
export async function bootAppLock(): Promise<void> {
  const lock = useAppLockStore()
  const known = startupFact('lockSet')
  const loading = lock.load().catch(() => undefined)
  if ((await known) !== false) await loading
  lock.watchPage()
  // Only the screen is awaited: the passcode check (with zod, through the backup code) follows while the page is idle.
  if (lock.locked) await loadLockScreen().catch(() => undefined)
  watch(
    () => lock.enabled,
    (on) => {
      if (on) whenIdle(() => void warmLock(), 5_000, 1_000)
    },
    { immediate: true },
  )
}
