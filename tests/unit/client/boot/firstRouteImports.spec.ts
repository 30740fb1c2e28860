import fs from 'node:fs'
import path from 'node:path'
import { describe, expect, it } from 'vitest'

// The first route (/ → PersonLayout → TodayPage) paints without zod, Dexie or the sending code: those load with import() when
// something is written, fails or is sent (boot/sync.ts, stores/session.ts, db/entrySchemas.ts, api/http.ts). This walks
// the static, non-type imports from main.ts, the app it starts (startApp.ts) and the first route's components, so a new static import that would put
// zod back on the first screen fails here rather than only in `npm run bench -- pages`.
const root = path.resolve(__dirname, '../../../..')
const FIRST_ROUTE = ['client/main.ts', 'client/startApp.ts', 'client/layouts/PersonLayout.vue', 'client/pages/TodayPage.vue']

function resolveImport(from: string, spec: string): string | undefined {
  let base: string
  if (spec.startsWith('@/')) base = path.join(root, 'client', spec.slice(2))
  else if (spec.startsWith('@shared/')) base = path.join(root, 'shared', spec.slice(8))
  else if (spec.startsWith('.')) base = path.resolve(path.dirname(from), spec)
  else return undefined
  return ['', '.ts', '.vue', '/index.ts'].map((ext) => base + ext).find((f) => fs.existsSync(f) && fs.statSync(f).isFile())
}

/** Static imports that bring code at run time: `import type …` and `import { type A, type B } …` bring none. */
function runtimeImports(file: string): string[] {
  let source = fs.readFileSync(file, 'utf8')
  if (file.endsWith('.vue')) source = [...source.matchAll(/<script[^>]*>([\s\S]*?)<\/script>/g)].map((m) => m[1]).join('\n')
  const specs: string[] = []
  for (const m of source.matchAll(/^\s*(import|export)\s+(type\s+)?([^'"]*?)\s*(?:from\s+)?['"]([^'"]+)['"]/gm)) {
    const [, keyword, typeOnly, clause, spec] = m
    if (typeOnly) continue
    if (keyword === 'export' && !/\bfrom\b/.test(m[0])) continue
    const names = /^\{([\s\S]*)\}$/.exec(clause!.trim())?.[1]
    if (names !== undefined && names.split(',').map((n) => n.trim()).filter(Boolean).every((n) => n.startsWith('type '))) continue
    specs.push(spec!)
  }
  return specs
}

/** Every module reached from the first route by static run-time imports, with the chain that reached it. */
function firstRouteGraph(): Map<string, string[]> {
  const seen = new Map<string, string[]>()
  const queue: [string, string[]][] = FIRST_ROUTE.map((f) => [path.join(root, f), [f]])
  while (queue.length) {
    const [file, chain] = queue.shift()!
    if (seen.has(file)) continue
    seen.set(file, chain)
    for (const spec of runtimeImports(file)) {
      const target = resolveImport(file, spec)
      if (target) queue.push([target, [...chain, path.relative(root, target)]])
      else seen.set(spec, [...chain, spec])
    }
  }
  return seen
}

describe('what the first route imports', () => {
  const graph = firstRouteGraph()
  const reached = (test: (id: string) => boolean) => [...graph].filter(([id]) => test(id)).map(([, chain]) => chain.join(' → '))

  it('walks the real first route (the shell, Today and the journal on the device)', () => {
    const files = [...graph.keys()].map((f) => path.relative(root, f))
    expect(files).toEqual(expect.arrayContaining(['client/App.vue', 'client/components/AppShell.vue', 'client/components/MomentForm.vue', 'client/db/entriesRepository.ts', 'client/stores/session.ts']))
    expect(files).toContain('client/db/openDb.ts')
  })

  it('reaches Dexie only through import() in db/openDb.ts, so a first visit paints before it loads', () => {
    expect(reached((id) => id === 'dexie' || id === path.join(root, 'client/db/db.ts') || id === path.join(root, 'client/db/RungsDB.ts'))).toEqual([])
    expect(fs.readFileSync(path.join(root, 'client/db/openDb.ts'), 'utf8')).toContain("import('./db')")
  })

  it('reaches neither zod nor a shared schema', () => {
    expect(reached((id) => id === 'zod' || id.startsWith('zod/') || id.includes(`${path.sep}shared${path.sep}schemas${path.sep}`))).toEqual([])
  })

  it('reaches neither the outbox, the share and link calls, nor the lock screen', () => {
    const lazy = ['client/sync/outbox.ts', 'client/sync/outboxRunner.ts', 'client/stores/links.ts', 'client/api/shares.ts', 'client/api/links.ts', 'client/components/AppLockScreen.vue']
    expect(reached((id) => lazy.some((f) => id === path.join(root, f)))).toEqual([])
  })
})
