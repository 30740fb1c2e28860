import fs from 'node:fs'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { makeTestApp, type TestApp } from '../../helpers/testApp'
import { listRoutes, routesForPart } from './routeList'

let t: TestApp
beforeAll(async () => { t = await makeTestApp() })
afterAll(async () => { await t.close() })

/** The routes the authorisation matrix names, read from its own file, as "METHOD /api/path" with ids as wildcards. */
function matrixRoutes(): { method: string; pattern: RegExp; text: string }[] {
  const source = fs.readFileSync('tests/api/authzMatrix.api.spec.ts', 'utf8')
  return [...source.matchAll(/method: '(\w+)', url: \(\) => [`'](\/api\/[^`'?]+)/g)].map(([, method, url]) => ({
    method: method!.toUpperCase(),
    text: `${method!.toUpperCase()} ${url}`,
    pattern: new RegExp(`^${url!.replace(/\$\{[^}]+\}/g, ':id').replace(/[.]/g, '\\.').replace(/:id/g, '[^/]+')}$`),
  }))
}

describe('the fuzzer\'s route list comes from the app', () => {
  it('finds every route of the authorisation matrix, and the auth routes', () => {
    const routes = listRoutes(t.app)
    const asParams = routes.map((r) => ({ method: r.method, path: r.path.replace(/:\w+/g, 'X') }))
    const fromMatrix = matrixRoutes()
    expect(fromMatrix.length).toBeGreaterThan(20)
    for (const m of fromMatrix) {
      expect(asParams.some((r) => r.method === m.method && m.pattern.test(r.path)), `${m.text} is not in the app's route list`).toBe(true)
    }
    for (const needed of ['POST /api/auth/signin', 'POST /api/auth/signup', 'POST /api/auth/signout', 'GET /api/me', 'PATCH /api/admin/accounts/:id']) {
      expect(routes.map((r) => `${r.method} ${r.path}`)).toContain(needed)
    }
  })

  it('splits the routes into four parts that together hold each route once', () => {
    const all = listRoutes(t.app).map((r) => `${r.method} ${r.path}`)
    const parts = [0, 1, 2, 3].flatMap((p) => routesForPart(t.app, p, 4).map((r) => `${r.method} ${r.path}`))
    expect(parts.sort()).toEqual([...all].sort())
    expect(new Set(all).size).toBe(all.length)
  })
})
