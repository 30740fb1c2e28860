import type { Entry } from '@shared/schemas/entry.schema'
import { dbNow, openDb } from './openDb'
import { fromStored } from './entriesRepository'

/** The person's safety plan: at most one entry of kind 'safetyPlan' (the most recently edited, should a restore bring two). */
export async function getSafetyPlanEntry(): Promise<Entry | undefined> {
  const db = dbNow() ?? (await openDb())
  const rows = await db.entries.where('kind').equals('safetyPlan').toArray()
  const latest = rows.sort((a, b) => b.updatedAt - a.updatedAt)[0]
  return latest && fromStored(latest)
}

/** The one draft of the plan being edited (new or existing), so leaving mid-edit loses nothing. */
export const SAFETY_PLAN_DRAFT_ID = 'safetyPlan'
