import type { Entry } from '@shared/schemas/entry.schema'
import { dbNow, openDb } from './openDb'
import { fromStored } from './entriesRepository'

/** Every questionnaire entry on this device (finished or not), oldest first. Uses the kind index. */
export async function listMeasureEntries(): Promise<Entry[]> {
  const db = dbNow() ?? (await openDb())
  const rows = await db.entries.where('kind').equals('measure').toArray()
  return rows.map(fromStored).sort((a, b) => a.createdAt - b.createdAt)
}
