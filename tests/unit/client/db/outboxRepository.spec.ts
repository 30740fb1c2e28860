import { beforeEach, describe, expect, it } from 'vitest'
import { db } from '@/db/db'
import { createEntry, getEntry } from '@/db/entriesRepository'
import { markSendFailed, outboxCounts, putDisposition, queueShare, queueWithdraw, rearmOutbox, updateEntryAndRequeue } from '@/db/outboxRepository'

const A = '0b3f4c1d-8a2e-4f6b-9c7d-1e2f3a4b5c6d'
const B = '7e6d5c4b-3a29-4817-b6a5-f4e3d2c1b0a9'

const moment = (body = 'Walked to the shop') => createEntry({ kind: 'moment', body, wants: [], backgroundThoughts: [], tags: [] })

describe('outboxRepository', () => {
  beforeEach(async () => {
    await Promise.all([db.entries.clear(), db.trash.clear(), db.outbox.clear()])
  })

  it('queues nothing when a private entry is edited', async () => {
    const e = await moment()
    const next = await updateEntryAndRequeue(e.id, { body: 'Walked to the shop and back' })
    expect(next.version).toBe(2)
    expect(next.shares).toEqual([])
    expect(await db.outbox.count()).toBe(0)
  })

  it('re-queues every link the entry is shared with at the new version, but not a withdrawn one', async () => {
    const e = await moment()
    await queueShare(e.id, A)
    await queueShare(e.id, B)
    await queueWithdraw(e.id, B)
    await db.outbox.delete(`${e.id}:${B}`)
    await db.entries.update(e.id, { shares: [{ linkId: A, state: 'shared', sentVersion: 1 }, { linkId: B, state: 'withdrawn', sentVersion: 1 }] })

    await updateEntryAndRequeue(e.id, { body: 'Second thoughts' })

    const rows = await db.outbox.toArray()
    expect(rows.map((r) => [r.linkId, r.op, r.version])).toEqual([[A, 'put', 2]])
    expect((await getEntry(e.id))?.shares).toEqual([
      { linkId: A, state: 'queued', sentVersion: 1 },
      { linkId: B, state: 'withdrawn', sentVersion: 1 },
    ])
  })

  it('writes neither the edit nor the outbox row when the edit is invalid', async () => {
    const e = await moment()
    await queueShare(e.id, A)
    await db.outbox.update(`${e.id}:${A}`, { attempts: 3 })
    await expect(updateEntryAndRequeue(e.id, { body: 'x'.repeat(20001) })).rejects.toThrow()
    expect((await getEntry(e.id))?.version).toBe(1)
    expect(await db.outbox.get(`${e.id}:${A}`)).toMatchObject({ version: 1, attempts: 3 })
  })

  it('replaces a pending put with the withdrawal, keeping one row', async () => {
    const e = await moment()
    await queueShare(e.id, A)
    await queueWithdraw(e.id, A)
    const rows = await db.outbox.toArray()
    expect(rows).toHaveLength(1)
    expect(rows[0]).toMatchObject({ op: 'delete', version: 1 })
    expect((await getEntry(e.id))?.shares[0]?.state).toBe('withdrawing')
  })

  it('drops a pending put once the entry is private again, as after restoring a backup', async () => {
    const e = await moment()
    await queueShare(e.id, A)
    const row = (await db.outbox.get(`${e.id}:${A}`))!
    expect(await putDisposition(row)).toBe('send')
    await db.entries.update(e.id, { shares: [] })
    expect(await putDisposition(row)).toBe('drop')
  })

  it('counts waiting and failed rows, and a retry re-arms only the ones asked for', async () => {
    const e = await moment()
    const f = await moment('Another')
    await queueShare(e.id, A)
    await queueShare(f.id, A)
    await markSendFailed((await db.outbox.get(`${e.id}:${A}`))!, 8, 'offline')
    await markSendFailed((await db.outbox.get(`${f.id}:${A}`))!, 8, 'offline')
    expect(await outboxCounts()).toMatchObject({ pending: 0, failed: 2 })

    expect(await rearmOutbox(e.id, A, 1000)).toBe(1)
    expect(await outboxCounts()).toMatchObject({ pending: 1, failed: 1, nextAttemptAt: 1000 })
    expect(await db.outbox.get(`${e.id}:${A}`)).toMatchObject({ attempts: 0, failed: false })
    expect((await getEntry(e.id))?.shares[0]?.state).toBe('queued')
    expect((await getEntry(f.id))?.shares[0]?.state).toBe('failed')
  })
})
