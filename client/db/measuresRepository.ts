import type { Entry } from '@shared/schemas/entry.schema'
import { db } from './db'
import { fromStored } from './entriesRepository'

/** Every questionnaire entry on this device (finished or not), oldest first. Uses the kind index. */
export async function listMeasureEntries(): Promise<Entry[]> {
  const rows = await db.entries.where('kind').equals('measure').toArray()
  return rows.map(fromStored).sort((a, b) => a.createdAt - b.createdAt)
}
