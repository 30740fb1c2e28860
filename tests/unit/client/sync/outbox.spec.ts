import { createPinia, setActivePinia } from 'pinia'
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { db } from '@/db/db'
import { createEntry, getEntry, trashEntry } from '@/db/entriesRepository'
import { saveLinks } from '@/db/linksRepository'
import { queueShare, queueWithdraw, rearmOutbox, updateEntryAndRequeue } from '@/db/outboxRepository'
import { useEntriesStore } from '@/stores/entries'
import { BACKOFF_BASE_MS, BACKOFF_CAP_MS, MAX_ATTEMPTS, backoffDelay, drainOutbox } from '@/sync/outbox'
import { startOutbox, stopOutbox } from '@/sync/outboxRunner'

const LINK = '6f1c2a9e-3b7d-4c1e-9a2f-5d8e7b6c4a31'
const NOW = new Date('2026-12-01T10:00:00Z').getTime()

interface Call {
  method: string
  url: string
  body?: { version: number; payload: { id: string; version: number; body: string; shares: unknown[] } }
}
type Reply = { status: number; body?: unknown } | Promise<{ status: number; body?: unknown }>

let calls: Call[] = []
let reply: (call: Call) => Reply

function json(status: number, body: unknown): Response {
  return new Response(JSON.stringify(body), { status, headers: { 'content-type': 'application/json' } })
}

function stubFetch() {
  vi.stubGlobal(
    'fetch',
    vi.fn(async (url: string, init: RequestInit) => {
      if (url === '/api/auth/csrf') return json(200, { csrfToken: 'token' })
      const call: Call = { method: init.method ?? 'GET', url, body: init.body ? JSON.parse(String(init.body)) : undefined }
      calls.push(call)
      const r = await reply(call)
      if (r.status === 0) throw new TypeError('Failed to fetch')
      return json(r.status, r.body ?? {})
    }),
  )
}

const stored = (version: number) => ({ status: 200, body: { status: 'stored', version } })
const errorBody = (code: string, message = 'x') => ({ error: { code, message } })

async function newMoment(body = 'A quiet walk') {
  return createEntry({ kind: 'moment', body, wants: [], backgroundThoughts: [], tags: [] }, NOW)
}

describe('the outbox of shares', () => {
  beforeEach(async () => {
    await Promise.all([db.entries.clear(), db.trash.clear(), db.outbox.clear(), db.links.clear()])
    setActivePinia(createPinia())
    vi.useFakeTimers({ toFake: ['Date'] })
    vi.setSystemTime(NOW)
    calls = []
    reply = (c) => (c.method === 'PUT' ? stored(c.body!.version) : { status: 200, body: { status: 'withdrawn', version: 1 } })
    stubFetch()
  })
  afterEach(() => {
    stopOutbox()
    vi.useRealTimers()
    vi.unstubAllGlobals()
  })

  it('marks the share shared with the version sent, and sends no list of the device’s other shares', async () => {
    const e = await newMoment()
    await queueShare(e.id, LINK)
    expect((await getEntry(e.id))?.shares).toEqual([{ linkId: LINK, state: 'queued', sentVersion: 0 }])

    const report = await drainOutbox()

    expect(report.sent).toBe(1)
    expect(calls).toHaveLength(1)
    expect(calls[0]?.method).toBe('PUT')
    expect(calls[0]?.url).toBe(`/api/links/${LINK}/shares/${e.id}`)
    expect(calls[0]?.body?.version).toBe(1)
    expect(calls[0]?.body?.payload.shares).toEqual([])
    expect(calls[0]?.body?.payload.body).toBe('A quiet walk')
    expect((await getEntry(e.id))?.shares).toEqual([{ linkId: LINK, state: 'shared', sentVersion: 1 }])
    expect(await db.outbox.count()).toBe(0)
  })

  it('keeps one row per entry and link however many edits follow, at the newest version', async () => {
    const e = await newMoment()
    await queueShare(e.id, LINK)
    for (let i = 0; i < 5; i++) await updateEntryAndRequeue(e.id, { body: `edit ${i}` })

    const rows = await db.outbox.toArray()
    expect(rows).toHaveLength(1)
    expect(rows[0]).toMatchObject({ id: `${e.id}:${LINK}`, op: 'put', version: 6, attempts: 0 })

    await drainOutbox()
    expect(calls).toHaveLength(1)
    expect(calls[0]?.body?.version).toBe(6)
  })

  it('re-queues an edit of an entry already shared, in the same write', async () => {
    const e = await newMoment()
    await queueShare(e.id, LINK)
    await drainOutbox()
    const after = await updateEntryAndRequeue(e.id, { body: 'Changed my mind about the walk' })
    expect(after.shares).toEqual([{ linkId: LINK, state: 'queued', sentVersion: 1 }])
    expect(await db.outbox.get(`${e.id}:${LINK}`)).toMatchObject({ op: 'put', version: 2 })
  })

  it('does not lose a newer version saved while an older one is in flight', async () => {
    const e = await newMoment()
    await queueShare(e.id, LINK)
    let release!: () => void
    const held = new Promise<void>((r) => (release = r))
    let first = true
    reply = async (c) => {
      if (first) {
        first = false
        await held
      }
      return stored(c.body!.version)
    }

    const draining = drainOutbox()
    for (let i = 0; i < 20 && calls.length === 0; i++) await new Promise((r) => setTimeout(r, 5))
    expect(calls).toHaveLength(1)
    await useEntriesStore().update(e.id, { body: 'A quiet walk, and then rain' })
    release()
    await draining

    expect(await db.outbox.get(`${e.id}:${LINK}`)).toMatchObject({ op: 'put', version: 2 })
    expect((await getEntry(e.id))?.shares).toEqual([{ linkId: LINK, state: 'queued', sentVersion: 1 }])

    await drainOutbox()
    expect(calls.at(-1)?.body?.version).toBe(2)
    expect(calls.at(-1)?.body?.payload.body).toBe('A quiet walk, and then rain')
    expect((await getEntry(e.id))?.shares).toEqual([{ linkId: LINK, state: 'shared', sentVersion: 2 }])
    expect(await db.outbox.count()).toBe(0)
  })

  it('grows the backoff window from 2 s, doubling, capped at 10 minutes, with the wait anywhere inside it', () => {
    expect(backoffDelay(1, () => 0)).toBe(0)
    expect(backoffDelay(1, () => 0.9999)).toBe(BACKOFF_BASE_MS - 1)
    expect(backoffDelay(2, () => 0.9999)).toBe(2 * BACKOFF_BASE_MS - 1)
    expect(backoffDelay(4, () => 0.5)).toBe(4 * BACKOFF_BASE_MS)
    expect(backoffDelay(30, () => 0.9999)).toBe(Math.floor(0.9999 * BACKOFF_CAP_MS))
    expect(backoffDelay(12, () => 0.5)).toBe(BACKOFF_CAP_MS / 2)
    const waits = Array.from({ length: 200 }, () => backoffDelay(5))
    expect(Math.min(...waits)).toBeGreaterThanOrEqual(0)
    expect(Math.max(...waits)).toBeLessThan(16 * BACKOFF_BASE_MS)
    expect(new Set(waits).size).toBeGreaterThan(100)
  })

  it('waits with growing, jittered backoff when offline, keeps the share waiting, then marks it failed but keeps the row', async () => {
    const e = await newMoment()
    await queueShare(e.id, LINK)
    reply = () => ({ status: 0 })
    let now = NOW
    for (let attempt = 1; attempt < MAX_ATTEMPTS; attempt++) {
      const report = await drainOutbox(() => now, () => 0.75)
      expect(report.deferred).toBe(1)
      const row = (await db.outbox.get(`${e.id}:${LINK}`))!
      expect(row.attempts).toBe(attempt)
      const window = Math.min(BACKOFF_CAP_MS, BACKOFF_BASE_MS * 2 ** (attempt - 1))
      expect(row.nextAttemptAt - now).toBe(Math.floor(0.75 * window))
      expect(row.lastError).toMatch(/could not reach/)
      expect((await getEntry(e.id))?.shares[0]?.state).toBe('queued')
      // Not due yet: a drain a moment later sends nothing.
      const before = calls.length
      if (row.nextAttemptAt > now) {
        await drainOutbox(() => now + 1)
        expect(calls.length).toBe(before)
      }
      now = row.nextAttemptAt
    }
    const last = await drainOutbox(() => now)
    expect(last.failed).toBe(1)
    expect(await db.outbox.get(`${e.id}:${LINK}`)).toMatchObject({ failed: true, attempts: MAX_ATTEMPTS })
    expect((await getEntry(e.id))?.shares[0]?.state).toBe('failed')

    const sentSoFar = calls.length
    await drainOutbox(() => now + BACKOFF_CAP_MS * 10)
    expect(calls.length).toBe(sentSoFar)

    reply = (c) => stored(c.body!.version)
    expect(await rearmOutbox(e.id, LINK, now)).toBe(1)
    expect((await getEntry(e.id))?.shares[0]?.state).toBe('queued')
    await drainOutbox(() => now)
    expect((await getEntry(e.id))?.shares[0]).toEqual({ linkId: LINK, state: 'shared', sentVersion: 1 })
  })

  it('pauses on 401 and keeps every row as it was', async () => {
    const a = await newMoment('one')
    const b = await newMoment('two')
    await queueShare(a.id, LINK)
    await queueShare(b.id, LINK)
    reply = () => ({ status: 401, body: errorBody('unauthenticated', 'Please sign in.') })

    const report = await drainOutbox()

    expect(report.paused).toBe(true)
    expect(calls).toHaveLength(1)
    const rows = await db.outbox.toArray()
    expect(rows).toHaveLength(2)
    expect(rows.every((r) => r.attempts === 0 && !r.failed)).toBe(true)
    expect((await getEntry(a.id))?.shares[0]?.state).toBe('queued')
  })

  it('marks the share withdrawn and drops the row when the link has ended (409 link_not_active)', async () => {
    const e = await newMoment()
    await queueShare(e.id, LINK)
    reply = () => ({ status: 409, body: errorBody('link_not_active') })

    await drainOutbox()

    expect(await db.outbox.count()).toBe(0)
    expect((await getEntry(e.id))?.shares[0]?.state).toBe('withdrawn')
  })

  it('withdraws with a DELETE at the entry version, and sharing again sends a higher version', async () => {
    const e = await newMoment()
    await queueShare(e.id, LINK)
    await drainOutbox()
    await queueWithdraw(e.id, LINK)
    expect((await getEntry(e.id))?.shares[0]?.state).toBe('withdrawing')
    await drainOutbox()
    expect(calls.at(-1)).toMatchObject({ method: 'DELETE', url: `/api/links/${LINK}/shares/${e.id}?version=1` })
    expect((await getEntry(e.id))?.shares[0]).toEqual({ linkId: LINK, state: 'withdrawn', sentVersion: 1 })

    await queueShare(e.id, LINK)
    await drainOutbox()
    expect(calls.at(-1)?.body?.version).toBe(2)
    expect((await getEntry(e.id))?.shares[0]).toEqual({ linkId: LINK, state: 'shared', sentVersion: 2 })
  })

  it('keeps a row while its entry is in the trash and sends nothing for it', async () => {
    const e = await newMoment()
    await queueShare(e.id, LINK)
    await trashEntry(e.id)
    await drainOutbox()
    expect(calls).toHaveLength(0)
    expect(await db.outbox.count()).toBe(1)
  })

  it('drains on the timer and when the browser comes back online, only while it may send', async () => {
    vi.useFakeTimers({ toFake: ['Date', 'setInterval', 'clearInterval'] })
    vi.setSystemTime(NOW)
    const e = await newMoment()
    await saveLinks([])
    let allowed = false
    startOutbox({ canSend: () => allowed, intervalMs: 30_000 })
    await queueShare(e.id, LINK)
    window.dispatchEvent(new Event('online'))
    await new Promise((r) => setTimeout(r, 20))
    expect(calls).toHaveLength(0)

    allowed = true
    vi.advanceTimersByTime(30_000)
    for (let i = 0; i < 50 && calls.length === 0; i++) await new Promise((r) => setTimeout(r, 5))
    expect(calls).toHaveLength(1)
    for (let i = 0; i < 50 && (await db.outbox.count()) > 0; i++) await new Promise((r) => setTimeout(r, 5))
    expect((await getEntry(e.id))?.shares[0]?.state).toBe('shared')

    await updateEntryAndRequeue(e.id, { body: 'later' })
    window.dispatchEvent(new Event('online'))
    for (let i = 0; i < 50 && calls.length === 1; i++) await new Promise((r) => setTimeout(r, 5))
    expect(calls).toHaveLength(2)
    expect(calls[1]?.body?.version).toBe(2)
  })

  it('sends a row still in its backoff wait as soon as the browser comes back online', async () => {
    const e = await newMoment()
    await saveLinks([])
    reply = () => ({ status: 0 })
    await queueShare(e.id, LINK)
    await drainOutbox(Date.now, () => 0.99)
    const waiting = (await db.outbox.get(`${e.id}:${LINK}`))!
    expect(waiting.nextAttemptAt).toBeGreaterThan(Date.now())

    reply = (c) => stored(c.body!.version)
    startOutbox({ canSend: () => true, intervalMs: 60_000 })
    await new Promise((r) => setTimeout(r, 30))
    expect(calls).toHaveLength(1)
    window.dispatchEvent(new Event('online'))
    for (let i = 0; i < 50 && (await db.outbox.count()) > 0; i++) await new Promise((r) => setTimeout(r, 5))

    expect(await db.outbox.count()).toBe(0)
    expect((await getEntry(e.id))?.shares[0]).toEqual({ linkId: LINK, state: 'shared', sentVersion: 1 })
  })
})
