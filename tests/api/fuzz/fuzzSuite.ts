import { afterAll, describe, expect, it } from 'vitest'
import { apiErrorSchema } from '../../../shared/schemas/error.schema'
import { fuzzRoute, prototypeKeys, RUNS_PER_ROUTE, Session, startFuzzServer } from './fuzzHarness'
import { routesForPart } from './routeList'

/** The fuzz tests of one file: its share of the app's routes, then a check that the server is whole afterwards. */
export async function fuzzPart(part: number, parts: number): Promise<void> {
  const seed = Number(process.env.FUZZ_SEED ?? Math.floor(Math.random() * 2 ** 31))
  const s = await startFuzzServer()
  const before = prototypeKeys()
  const routes = routesForPart(s.t.app, part, parts)
  afterAll(async () => { await s.close() })

  describe(`fuzzing API routes, part ${part + 1} of ${parts}`, () => {
    it('has routes to fuzz', () => {
      expect(routes.length).toBeGreaterThan(5)
    })
    for (const route of routes) {
      it(`${route.method} ${route.path}: ${RUNS_PER_ROUTE} generated requests, no 5xx, every 4xx in the error shape`, async () => {
        const { statuses, failures } = await fuzzRoute(s, route, seed)
        expect(failures.slice(0, 5), `FUZZ_SEED=${seed}`).toEqual([])
        const total = Object.values(statuses).reduce((a, b) => a + b, 0)
        expect(total).toBe(RUNS_PER_ROUTE)
        expect(Object.keys(statuses).filter((code) => Number(code) >= 500)).toEqual([])
      }, 180_000)
    }
    it('still answers afterwards, and Object.prototype gained nothing', async () => {
      const health = await (await Session.open(s.base)).send('GET', '/api/me')
      expect(health.status).toBe(401)
      expect(apiErrorSchema.safeParse(health.json).success).toBe(true)
      expect(prototypeKeys()).toEqual(before)
      expect(({} as Record<string, unknown>).polluted).toBeUndefined()
      expect(({} as Record<string, unknown>).isAdmin).toBeUndefined()
    })
  })
}
