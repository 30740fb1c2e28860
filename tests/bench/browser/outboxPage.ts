// The app's own sign-in, links client, repositories and outbox drain, against the real Rungs server on the same origin.
import { signIn } from '@/api/auth'
import { fetchLinks } from '@/api/links'
import { db } from '@/db/db'
import { createEntry } from '@/db/entriesRepository'
import { queueShare } from '@/db/outboxRepository'
import { drainOutbox } from '@/sync/outbox'
import { spread, type OutboxResults } from '../benchResults'
import { makeGenerator } from './benchEntries'

declare global {
  interface Window {
    runOutboxBench(email: string, password: string, count: number): Promise<OutboxResults>
  }
}

// A drain that never empties the outbox (every send deferred, say) must end the run, not spin.
const MAX_DRAINS = 20

async function runOutboxBench(email: string, password: string, count: number): Promise<OutboxResults> {
  await db.open()
  await Promise.all([db.entries.clear(), db.outbox.clear()])
  await signIn({ email, password })
  const link = (await fetchLinks()).links.find((l) => l.state === 'active')
  if (!link) throw new Error('The signed-in person has no active link.')

  const gen = makeGenerator(4)
  const fillStart = performance.now()
  const entryIds: string[] = []
  for (let i = 0; i < count; i++) entryIds.push((await createEntry(gen.moment())).id)
  const createMs = performance.now() - fillStart
  const queueStart = performance.now()
  for (const id of entryIds) await queueShare(id, link.id)
  const queueMs = performance.now() - queueStart
  const queued = await db.outbox.count()

  // Every share PUT's own network timing, read from the resource timing buffer (250 entries by default).
  performance.clearResourceTimings()
  performance.setResourceTimingBufferSize(count * 4 + 100)
  const drains: OutboxResults['drains'] = []
  const drainStart = performance.now()
  while ((await db.outbox.count()) > 0 && drains.length < MAX_DRAINS) {
    const start = performance.now()
    const report = await drainOutbox()
    drains.push({ ...report, ms: performance.now() - start })
    if (report.paused) break
  }
  const drainMs = performance.now() - drainStart
  const puts = performance
    .getEntriesByType('resource')
    .filter((e): e is PerformanceResourceTiming => e instanceof PerformanceResourceTiming && e.initiatorType === 'fetch' && /\/api\/links\/[^/]+\/shares\//.test(e.name))
  // Gaps between one PUT's response and the next PUT's start: the device's own work per row (Dexie reads and writes).
  const starts = puts.map((p) => p.startTime)
  const gaps = starts.slice(1).map((s, i) => s - puts[i]!.responseEnd)

  const rows = await db.entries.bulkGet(entryIds)
  const sharedLocally = rows.filter((r) => r?.shares.some((s) => s.linkId === link.id && s.state === 'shared' && s.sentVersion === r.version)).length
  return {
    count,
    linkId: link.id,
    entryIds,
    queued,
    createMs,
    queueMs,
    drainMs,
    drains,
    left: await db.outbox.count(),
    sharedLocally,
    requests: puts.length,
    roundTrip: puts.length ? spread(puts.map((p) => p.responseEnd - p.startTime)) : undefined,
    roundTripSumMs: puts.reduce((sum, p) => sum + (p.responseEnd - p.startTime), 0),
    between: gaps.length ? spread(gaps) : undefined,
  }
}

window.runOutboxBench = runOutboxBench
