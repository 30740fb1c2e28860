import { beforeEach, describe, expect, it, vi } from 'vitest'

const LINK = '0b3f4c1d-8a2e-4f6b-9c7d-1e2f3a4b5c6d'

/** A fresh copy of the db modules, as after a page load: the entry schemas (loaded lazily) are not loaded yet. */
async function freshModules() {
  vi.resetModules()
  const [{ db }, entries, outbox, schemas] = await Promise.all([
    import('@/db/db'),
    import('@/db/entriesRepository'),
    import('@/db/outboxRepository'),
    import('@/db/entrySchemas'),
  ])
  return { db, ...entries, ...outbox, ...schemas }
}

describe('entry schemas loaded with the first write', () => {
  beforeEach(async () => {
    const { db } = await freshModules()
    await Promise.all([db.entries.clear(), db.outbox.clear()])
  })

  it('are not loaded by reading the journal, and are loaded by the first save, which still refuses bad input', async () => {
    const m = await freshModules()
    expect(await m.recentEntries(5)).toEqual([])
    expect(m.loadedEntrySchemas()).toBeUndefined()
    await expect(m.createEntry({ kind: 'moment', body: 'x', distressBefore: 140, wants: [], backgroundThoughts: [], tags: [] })).rejects.toThrow()
    expect(await m.db.entries.count()).toBe(0)
    expect(m.loadedEntrySchemas()).toBeDefined()
  })

  it('saves the edit of a shared entry and its outbox row together when the edit is the first write since start', async () => {
    const before = await freshModules()
    const created = await before.createEntry({ kind: 'moment', body: 'Walked to the shop', wants: [], backgroundThoughts: [], tags: [] })
    await before.queueShare(created.id, LINK)
    await before.db.outbox.clear()
    await before.db.entries.update(created.id, { shares: [{ linkId: LINK, state: 'shared', sentVersion: 1 }] })

    // A reload: the edit is the first thing that needs the schemas, inside updateEntryAndRequeue's transaction.
    const after = await freshModules()
    expect(after.loadedEntrySchemas()).toBeUndefined()
    const next = await after.updateEntryAndRequeue(created.id, { body: 'Walked to the shop and back' })

    expect(next.version).toBe(2)
    const stored = await after.db.entries.get(created.id)
    expect(stored).toMatchObject({ body: 'Walked to the shop and back', version: 2, shares: [{ linkId: LINK, state: 'queued', sentVersion: 1 }] })
    expect((await after.db.outbox.toArray()).map((r) => [r.entryId, r.linkId, r.op, r.version])).toEqual([[created.id, LINK, 'put', 2]])
  })
})
