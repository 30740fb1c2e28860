import { purgeTrash } from '@/db/entriesRepository'

/** Deleted entries stay a day for Undo (even across a closed tab), then go for good. */
export function bootJournal(): void {
  void purgeTrash()
}
