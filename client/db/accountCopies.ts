import { dbNow, openDb } from './openDb'

/**
 * After the account is closed: forgets this device's copies of the links, the earlier scores and every pending send,
 * marks every entry private (the shared copies are gone from the server), and stops the device asking the server who is
 * signed in. The journal itself stays.
 */
export async function clearAccountCopies(): Promise<void> {
  const db = dbNow() ?? (await openDb())
  await db.transaction('rw', [db.links, db.outbox, db.earlierScores, db.entries, db.settings], async () => {
    await Promise.all([db.links.clear(), db.outbox.clear(), db.earlierScores.clear()])
    await db.entries.filter((e) => e.shares.length > 0).modify({ shares: [] })
    await db.settings.delete('signedInBefore')
  })
}
