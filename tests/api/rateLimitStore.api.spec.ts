import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Options } from 'express-rate-limit'
import { Op } from 'sequelize'
import { initModels } from '../../server/db/associations'
import { openDatabase } from '../../server/db/sequelize'
import { DatabaseRateLimitStore } from '../../server/middleware/DatabaseRateLimitStore'
import { makeTestApp, type TestApp } from '../helpers/testApp'

// The store against the test database (SQLite, or PostgreSQL under TEST_DATABASE_URL).
let t: TestApp
beforeAll(async () => { t = await makeTestApp() })
afterAll(async () => { await t.close() })

const WINDOW = 60_000
function storeAt(name: string, clock: { now: number }, counters = t.deps.models.RateLimitCounter) {
  const store = new DatabaseRateLimitStore(counters, name, () => clock.now)
  store.init({ windowMs: WINDOW } as Options)
  return store
}

describe('DatabaseRateLimitStore', () => {
  it('counts hits in a window, starts again once it has passed, and keeps only a hash of the client key', async () => {
    const clock = { now: 1_800_000_000_000 }
    const store = storeAt('window-test', clock)
    expect(await store.increment('203.0.113.7')).toEqual({ totalHits: 1, resetTime: new Date(clock.now + WINDOW) })
    clock.now += 1000
    expect((await store.increment('203.0.113.7')).totalHits).toBe(2)
    expect((await store.increment('198.51.100.2')).totalHits).toBe(1)
    expect(await store.get('203.0.113.7')).toEqual({ totalHits: 2, resetTime: new Date(clock.now - 1000 + WINDOW) })

    const rows = await t.deps.models.RateLimitCounter.findAll({ where: { key: { [Op.startsWith]: 'window-test:' } } })
    expect(rows.map((r) => r.hits).sort()).toEqual([1, 2])
    for (const r of rows) expect(r.key).not.toContain('203.0.113')

    clock.now += WINDOW
    expect(await store.get('203.0.113.7')).toBeUndefined()
    expect(await store.increment('203.0.113.7')).toEqual({ totalHits: 1, resetTime: new Date(clock.now + WINDOW) })
    // The tidy-up after that hit removed the other, expired client.
    expect(await t.deps.models.RateLimitCounter.count({ where: { key: { [Op.startsWith]: 'window-test:' } } })).toBe(1)
  })

  it('takes a hit back on decrement, forgets a client on resetKey, and keeps limiters apart by name', async () => {
    const clock = { now: 1_800_000_000_000 }
    const signIn = storeAt('signin-test', clock)
    const codes = storeAt('codes-test', clock)
    await signIn.increment('k')
    await signIn.increment('k')
    await codes.increment('k')
    await signIn.decrement('k')
    expect((await signIn.get('k'))!.totalHits).toBe(1)
    expect((await codes.get('k'))!.totalHits).toBe(1)
    await signIn.resetKey('k')
    expect(await signIn.get('k')).toBeUndefined()
    expect((await codes.get('k'))!.totalHits).toBe(1)
    await codes.resetAll()
    expect(await t.deps.models.RateLimitCounter.count({ where: { key: { [Op.startsWith]: 'codes-test:' } } })).toBe(0)
  })

  it('gives every one of many simultaneous hits from two connections its own count', async () => {
    // A second Sequelize on the same database stands for a second app instance.
    const other = await openDatabase(t.databaseUrl.startsWith('sqlite:') ? t.databaseUrl.slice('sqlite:'.length) : t.databaseUrl)
    try {
      const clock = { now: 1_800_000_000_000 }
      const here = storeAt('burst-test', clock)
      const there = storeAt('burst-test', clock, initModels(other).RateLimitCounter)
      const counts = await Promise.all(Array.from({ length: 40 }, (_, i) => (i % 2 ? here : there).increment('one-client')))
      expect(counts.map((c) => c.totalHits).sort((x, y) => x - y)).toEqual(Array.from({ length: 40 }, (_, i) => i + 1))
      expect((await here.get('one-client'))!.totalHits).toBe(40)
    } finally {
      await other.close()
    }
  })

  it('refuses a name that could run into another limiter', () => {
    expect(() => new DatabaseRateLimitStore(t.deps.models.RateLimitCounter, 'sign in:')).toThrow(/name/)
  })
})
