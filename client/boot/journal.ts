import { purgeTrash } from '@/db/entriesRepository'

/**
 * Deleted entries stay a day for Undo (even across a closed tab), then go for good. The purge waits until the page is
 * idle after the first paint: it is a write to the device database that no first screen needs.
 */
export function bootJournal(): void {
  const purge = () => void purgeTrash().catch(() => undefined)
  if (typeof requestIdleCallback === 'function') requestIdleCallback(purge, { timeout: 10_000 })
  else setTimeout(purge, 2_000)
}
