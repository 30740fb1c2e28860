import type { EarlierScoreView } from '@shared/schemas/measure.schema'
import { dbNow, openDb } from './openDb'
import type { StoredEarlierScore } from './RungsDB'

/** Replaces this link's cached earlier scores with what the server just said, in one transaction. */
export async function saveEarlierScores(linkId: string, scores: EarlierScoreView[], now = Date.now()): Promise<void> {
  const db = dbNow() ?? (await openDb())
  await db.transaction('rw', db.earlierScores, async () => {
    await db.earlierScores.where('linkId').equals(linkId).delete()
    await db.earlierScores.bulkPut(scores.map((s) => ({ ...s, linkId, syncedAt: now })))
  })
}

/** Every cached earlier score, of every link, so the history shows offline. */
export async function listEarlierScores(): Promise<StoredEarlierScore[]> {
  const db = dbNow() ?? (await openDb())
  return db.earlierScores.toArray()
}
