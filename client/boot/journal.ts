import { purgeTrash } from '@/db/entriesRepository'
import { whenIdle } from '@/utils/whenIdle'

/**
 * Deleted entries stay a day for Undo (even across a closed tab), then go for good. The purge waits until the page is
 * idle after the first paint: it is a write to the device database that no first screen needs.
 */
export function bootJournal(): void {
  whenIdle(() => void purgeTrash().catch(() => undefined), 10_000, 2_000)
}
