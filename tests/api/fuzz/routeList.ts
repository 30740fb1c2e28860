import type { Express } from 'express'

export interface AppRoute {
  method: 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE'
  /** Express path with `:params`, e.g. /api/links/:linkId/shares/:entryId */
  path: string
}

interface Layer {
  route?: { path: string | string[]; methods: Record<string, boolean> }
  rawPath?: string | string[]
  handle?: { stack?: Layer[] }
}

/**
 * Every route the app answers, read from Express 5's own router stack (nested routers included), so a route added
 * tomorrow is fuzzed tomorrow without anyone editing a list.
 */
export function listRoutes(app: Express): AppRoute[] {
  const out: AppRoute[] = []
  const walk = (stack: Layer[], prefix: string) => {
    for (const layer of stack) {
      if (layer.route) {
        for (const p of [layer.route.path].flat()) {
          for (const [m, on] of Object.entries(layer.route.methods)) {
            if (!on || m === '_all') continue
            const path = (prefix + p).replace(/\/$/, '') || '/'
            out.push({ method: m.toUpperCase() as AppRoute['method'], path })
          }
        }
      } else if (layer.handle?.stack) {
        const mount = typeof layer.rawPath === 'string' && layer.rawPath !== '/' ? layer.rawPath : ''
        walk(layer.handle.stack, prefix + mount)
      }
    }
  }
  walk((app as unknown as { router: { stack: Layer[] } }).router.stack, '')
  return out.filter((r) => r.path.startsWith('/api/')).sort((a, b) => `${a.path} ${a.method}`.localeCompare(`${b.path} ${b.method}`))
}

export type FuzzRole = 'person' | 'therapist' | 'admin'

/** The role that can reach a route; routes open to anyone (auth, me) are fuzzed signed in as a person. */
export function roleFor(route: AppRoute): FuzzRole {
  if (route.path.startsWith('/api/admin')) return 'admin'
  if (route.path.startsWith('/api/therapist')) return 'therapist'
  return 'person'
}

/** The routes of one fuzz file: a fixed split by position, so new routes land in some file automatically. */
export function routesForPart(app: Express, part: number, parts: number): AppRoute[] {
  return listRoutes(app).filter((_r, i) => i % parts === part)
}
