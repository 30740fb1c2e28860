import { useAppLockStore } from '@/stores/appLock'

/**
 * Decides the app lock before the app mounts, so a person's page never paints before the lock covers it. If the
 * device database cannot be read, the journal cannot be read either, so the app starts without a lock.
 */
export async function bootAppLock(): Promise<void> {
  const lock = useAppLockStore()
  await lock.load().catch(() => undefined)
  lock.watchPage()
}
