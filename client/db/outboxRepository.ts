import type { Entry, EntryInput } from '@shared/schemas/entry.schema'
import { dbNow, openDb } from './openDb'
import { fromStored, updateEntry } from './entriesRepository'
import { loadEntrySchemas } from './entrySchemas'
import type { OutboxRow } from './RungsDB'

type ShareState = Entry['shares'][number]['state']
type Share = Entry['shares'][number]

export const outboxId = (entryId: string, linkId: string) => `${entryId}:${linkId}`

/** Share states whose copy should follow every edit of the entry. */
const FOLLOWS_EDITS: readonly ShareState[] = ['queued', 'shared', 'failed']

function withShare(shares: Share[], linkId: string, state: ShareState, sentVersion?: number): Share[] {
  const old = shares.find((s) => s.linkId === linkId)
  const next: Share = { linkId, state, sentVersion: sentVersion ?? old?.sentVersion ?? 0 }
  return old ? shares.map((s) => (s.linkId === linkId ? next : s)) : [...shares, next]
}

function freshRow(entryId: string, linkId: string, op: OutboxRow['op'], version: number, now: number): OutboxRow {
  return { id: outboxId(entryId, linkId), entryId, linkId, op, version, attempts: 0, nextAttemptAt: now }
}

/**
 * Marks the entry as waiting to be shared over the link and queues a 'put', in one transaction. The server ignores a
 * version it already holds as a withdrawal, so sharing again after a withdrawal raises the entry's version by one.
 */
export async function queueShare(entryId: string, linkId: string, now = Date.now()): Promise<void> {
  const db = dbNow() ?? (await openDb())
  await db.transaction('rw', db.entries, db.outbox, async () => {
    const row = await db.entries.get(entryId)
    if (!row) throw new Error('That entry is no longer on this device.')
    const old = row.shares.find((s) => s.linkId === linkId)
    const reshare = old !== undefined && (old.state === 'withdrawn' || old.state === 'withdrawing' || old.sentVersion >= row.version)
    const version = reshare ? row.version + 1 : row.version
    await db.entries.update(entryId, { version, shares: withShare(row.shares, linkId, 'queued') })
    await db.outbox.put(freshRow(entryId, linkId, 'put', version, now))
  })
}

/** Marks the share as being withdrawn and queues a 'delete' at the entry's version, replacing any pending 'put'. */
export async function queueWithdraw(entryId: string, linkId: string, now = Date.now()): Promise<void> {
  const db = dbNow() ?? (await openDb())
  await db.transaction('rw', db.entries, db.outbox, async () => {
    const row = await db.entries.get(entryId)
    if (!row) throw new Error('That entry is no longer on this device.')
    await db.entries.update(entryId, { shares: withShare(row.shares, linkId, 'withdrawing') })
    await db.outbox.put(freshRow(entryId, linkId, 'delete', row.version, now))
  })
}

/**
 * Saves an edit and, in the same transaction, re-queues a 'put' at the new version for every link the entry is shared
 * (or waiting to be shared) with. The one row per entry and link is replaced, so autosaved edits never flood the outbox.
 */
export async function updateEntryAndRequeue(id: string, patch: Partial<EntryInput>, now = Date.now()): Promise<Entry> {
  const db = dbNow() ?? (await openDb())
  // Before the transaction, so updateEntry inside it awaits only IndexedDB.
  await loadEntrySchemas()
  return db.transaction('rw', db.entries, db.outbox, async () => {
    const next = await updateEntry(id, patch, now)
    const follow = next.shares.filter((s) => FOLLOWS_EDITS.includes(s.state))
    if (!follow.length) return next
    const shares = next.shares.map((s) => (FOLLOWS_EDITS.includes(s.state) ? { ...s, state: 'queued' as const } : s))
    await db.entries.update(id, { shares })
    await db.outbox.bulkPut(follow.map((s) => freshRow(id, s.linkId, 'put', next.version, now)))
    return { ...next, shares }
  })
}

/** Rows whose next attempt is due, oldest first; rows that gave up wait for the person's retry. */
export async function dueOutboxRows(now = Date.now()): Promise<OutboxRow[]> {
  const db = dbNow() ?? (await openDb())
  return (await db.outbox.where('nextAttemptAt').belowOrEqual(now).toArray()).filter((r) => !r.failed)
}

export async function getOutboxRow(id: string): Promise<OutboxRow | undefined> {
  const db = dbNow() ?? (await openDb())
  return db.outbox.get(id)
}

/** The entry as the therapist will receive it: the device's list of its own shares stays on the device. */
export async function entryForSending(entryId: string): Promise<Entry | undefined> {
  const db = dbNow() ?? (await openDb())
  const row = await db.entries.get(entryId)
  return row && { ...fromStored(row), shares: [] }
}

/**
 * What to do with a due 'put': send it; drop it when the entry is gone for good or is no longer meant to be shared over
 * the link (a restored backup brings entries back private); or wait while the entry sits in the trash (Undo may bring it
 * back).
 */
export async function putDisposition(row: OutboxRow): Promise<'send' | 'drop' | 'wait'> {
  const db = dbNow() ?? (await openDb())
  const entry = await db.entries.get(row.entryId)
  if (!entry) return (await isInTrash(row.entryId)) ? 'wait' : 'drop'
  const share = entry.shares.find((s) => s.linkId === row.linkId)
  return share && (share.state === 'queued' || share.state === 'failed') ? 'send' : 'drop'
}

/** Whether the entry is still in the trash (it may come back with Undo), so a pending row is kept meanwhile. */
export async function isInTrash(entryId: string): Promise<boolean> {
  const db = dbNow() ?? (await openDb())
  return (await db.trash.get(entryId)) !== undefined
}

/**
 * Records a send the server accepted. The row is deleted only if it still holds the op that was sent at a version the
 * send covers: a newer edit may have replaced it meanwhile, and that one must still go.
 */
export async function completeSend(sent: OutboxRow, sentVersion: number): Promise<void> {
  const db = dbNow() ?? (await openDb())
  await db.transaction('rw', db.entries, db.outbox, async () => {
    const current = await db.outbox.get(sent.id)
    const covered = current !== undefined && current.op === sent.op && current.version <= sentVersion
    if (covered) await db.outbox.delete(sent.id)
    const entry = await db.entries.get(sent.entryId)
    if (!entry) return
    // Not covered: the newer op already set the state the person sees ('queued' or 'withdrawing'); keep it.
    const state: ShareState = covered ? (sent.op === 'put' ? 'shared' : 'withdrawn') : (entry.shares.find((s) => s.linkId === sent.linkId)?.state ?? 'queued')
    const sentAt = sent.op === 'put' ? sentVersion : undefined
    await db.entries.update(sent.entryId, { shares: withShare(entry.shares, sent.linkId, state, sentAt) })
  })
}

/** The link has ended on the server: nothing more can go over it, and what was there has been withdrawn. */
export async function dropForEndedLink(sent: OutboxRow): Promise<void> {
  const db = dbNow() ?? (await openDb())
  await db.transaction('rw', db.entries, db.outbox, async () => {
    await db.outbox.delete(sent.id)
    const entry = await db.entries.get(sent.entryId)
    if (entry) await db.entries.update(sent.entryId, { shares: withShare(entry.shares, sent.linkId, 'withdrawn') })
  })
}

/** Drops a row that has nothing left to send (the entry is gone from the device, or it is private again). */
export async function dropOutboxRow(id: string): Promise<void> {
  const db = dbNow() ?? (await openDb())
  await db.outbox.delete(id)
}

/** Schedules the next try after a failure that may pass (offline, server trouble). */
export async function deferSend(id: string, attempts: number, nextAttemptAt: number, lastError: string): Promise<void> {
  const db = dbNow() ?? (await openDb())
  await db.outbox.update(id, { attempts, nextAttemptAt, lastError })
}

/** Gives up on automatic tries: the entry shows "failed" and the row stays until the person retries. */
export async function markSendFailed(sent: OutboxRow, attempts: number, lastError: string): Promise<void> {
  const db = dbNow() ?? (await openDb())
  await db.transaction('rw', db.entries, db.outbox, async () => {
    const current = await db.outbox.get(sent.id)
    if (!current) return
    await db.outbox.update(sent.id, { attempts, failed: true, lastError })
    const entry = await db.entries.get(sent.entryId)
    if (entry) await db.entries.update(sent.entryId, { shares: withShare(entry.shares, sent.linkId, 'failed') })
  })
}

/** The person's retry: the row is due at once with a fresh count, and the entry shows it is waiting again. */
export async function rearmOutbox(entryId?: string, linkId?: string, now = Date.now()): Promise<number> {
  const db = dbNow() ?? (await openDb())
  return db.transaction('rw', db.entries, db.outbox, async () => {
    const rows = (await db.outbox.toArray()).filter((r) => r.failed && (!entryId || r.entryId === entryId) && (!linkId || r.linkId === linkId))
    for (const r of rows) {
      await db.outbox.update(r.id, { failed: false, attempts: 0, nextAttemptAt: now })
      const entry = await db.entries.get(r.entryId)
      if (entry) await db.entries.update(r.entryId, { shares: withShare(entry.shares, r.linkId, r.op === 'put' ? 'queued' : 'withdrawing') })
    }
    return rows.length
  })
}

export interface OutboxCounts {
  pending: number
  failed: number
  /** When the next automatic try is due, if any row is waiting. */
  nextAttemptAt?: number
}

export async function outboxCounts(): Promise<OutboxCounts> {
  const db = dbNow() ?? (await openDb())
  const rows = await db.outbox.toArray()
  const waiting = rows.filter((r) => !r.failed)
  const next = waiting.reduce<number | undefined>((min, r) => (min === undefined || r.nextAttemptAt < min ? r.nextAttemptAt : min), undefined)
  return { pending: waiting.length, failed: rows.length - waiting.length, nextAttemptAt: next }
}

export async function outboxRowsFor(entryId: string): Promise<OutboxRow[]> {
  const db = dbNow() ?? (await openDb())
  return db.outbox.where('id').startsWith(`${entryId}:`).toArray()
}
