import { ApiError } from '@/api/http'
import { deleteShare, putShare } from '@/api/shares'
import {
  completeSend,
  deferSend,
  dropForEndedLink,
  dropOutboxRow,
  dueOutboxRows,
  entryForSending,
  markSendFailed,
  putDisposition,
} from '@/db/outboxRepository'
import type { OutboxRow } from '@/db/RungsDB'

/** First retry waits up to 2 s; each later one doubles the window. */
export const BACKOFF_BASE_MS = 2_000
/** No wait is ever longer than 10 minutes, so a long outage is noticed soon after it ends. */
export const BACKOFF_CAP_MS = 10 * 60_000
/** After this many automatic tries the share shows "failed" and waits for the person's retry (about 8 min in all at most). */
export const MAX_ATTEMPTS = 8

/**
 * Exponential backoff with full jitter: the wait is uniform in [0, min(cap, base · 2^(attempts − 1))]. Full jitter spreads
 * retries from many devices after an outage instead of having them arrive together (M. Brooker, "Exponential Backoff And
 * Jitter", AWS Architecture Blog, 2015).
 */
export function backoffDelay(attempts: number, random: () => number = Math.random): number {
  const window = Math.min(BACKOFF_CAP_MS, BACKOFF_BASE_MS * 2 ** Math.max(0, attempts - 1))
  return Math.floor(random() * window)
}

export interface DrainReport {
  sent: number
  deferred: number
  failed: number
  /** The server said the session ended: nothing was dropped, and draining stops until the person signs in. */
  paused: boolean
}

const retryable = (err: unknown) => !(err instanceof ApiError) || err.status === 0 || err.status === 429 || err.status >= 500

/** The person-facing reason for a failure: the server's own plain message, never entry text. */
const reasonOf = (err: unknown) => (err instanceof ApiError ? err.message : 'Something went wrong while sending.')

async function sendOne(row: OutboxRow): Promise<number | 'nothing'> {
  if (row.op === 'delete') {
    await deleteShare(row.linkId, row.entryId, row.version)
    return row.version
  }
  const entry = await entryForSending(row.entryId)
  if (!entry) return 'nothing'
  await putShare(row.linkId, entry)
  return entry.version
}

/**
 * Sends every due outbox row once, oldest first (DESIGN.md, Outbox). On success the entry's share is marked shared or
 * withdrawn and the row goes, unless a newer edit replaced it while the request was out. A network or server failure
 * waits with backoff; after MAX_ATTEMPTS the share is marked failed and the row is kept. A 401 pauses and keeps every
 * row; a 409 link_not_active marks the share withdrawn and drops the row. `ignoreBackoff` (used when the browser comes
 * back online) sends every waiting row at once; rows marked failed still wait for the person's retry.
 */
export async function drainOutbox(now: () => number = Date.now, random: () => number = Math.random, options: { ignoreBackoff?: boolean } = {}): Promise<DrainReport> {
  const report: DrainReport = { sent: 0, deferred: 0, failed: 0, paused: false }
  // Back online: the waits were guesses at when the network returns, so everything waiting goes now.
  const dueBy = options.ignoreBackoff ? Number.MAX_SAFE_INTEGER : now()
  for (const row of await dueOutboxRows(dueBy)) {
    if (row.op === 'put') {
      const disposition = await putDisposition(row)
      if (disposition === 'drop') await dropOutboxRow(row.id)
      if (disposition !== 'send') continue
    }
    try {
      const sentVersion = await sendOne(row)
      if (sentVersion === 'nothing') continue
      await completeSend(row, sentVersion)
      report.sent++
    } catch (err) {
      if (err instanceof ApiError && err.status === 401) {
        report.paused = true
        return report
      }
      if (err instanceof ApiError && err.status === 409 && err.code === 'link_not_active') {
        await dropForEndedLink(row)
        continue
      }
      const attempts = row.attempts + 1
      if (retryable(err) && attempts < MAX_ATTEMPTS) {
        await deferSend(row.id, attempts, now() + backoffDelay(attempts, random), reasonOf(err))
        report.deferred++
      } else {
        await markSendFailed(row, attempts, reasonOf(err))
        report.failed++
      }
    }
  }
  return report
}
