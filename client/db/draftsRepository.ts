import { dbNow, openDb } from './openDb'
import type { Draft } from './RungsDB'

export async function readDraft(id: string): Promise<Draft | undefined> {
  const db = dbNow() ?? (await openDb())
  return db.drafts.get(id)
}

export async function saveDraft(draft: Omit<Draft, 'updatedAt'>, now = Date.now()): Promise<void> {
  const db = dbNow() ?? (await openDb())
  await db.drafts.put({ ...draft, updatedAt: now })
}

export async function discardDraft(id: string): Promise<void> {
  const db = dbNow() ?? (await openDb())
  await db.drafts.delete(id)
}

/** Drafts that are not edits of existing entries, newest first: the "carry on" list on Today. */
export async function openDrafts(): Promise<Draft[]> {
  const db = dbNow() ?? (await openDb())
  return db.drafts.orderBy('updatedAt').reverse().toArray()
}
