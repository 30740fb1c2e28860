import fs from 'node:fs'
import { createRequire } from 'node:module'
import path from 'node:path'
import postcss from 'postcss'
import { beforeAll, describe, expect, it } from 'vitest'
import { purgeQuasarCss } from '../../../client/build/unusedQuasarCss'

// Runs the build's pass over the real Quasar stylesheet and the real client sources, then looks for rules by selector.
const require = createRequire(import.meta.url)
const quasarCss = fs.readFileSync(path.join(path.dirname(require.resolve('quasar/package.json')), 'dist/quasar.css'), 'utf8')
const clientDir = path.resolve(__dirname, '../../../client')

function classesIn(css: string): Set<string> {
  const found = new Set<string>()
  postcss.parse(css).walkRules((rule) => {
    for (const m of rule.selector.matchAll(/\.([A-Za-z_][\w-]*)/g)) found.add(m[1]!)
  })
  return found
}

describe("the build's pass over Quasar's CSS", () => {
  let kept: Set<string>
  let full: Set<string>
  let keptCss: string
  beforeAll(async () => {
    keptCss = (await purgeQuasarCss(quasarCss, clientDir)).css
    kept = classesIn(keptCss)
    full = classesIn(quasarCss)
  }, 60_000)

  it('keeps classes written in the app and in the Quasar code it uses', () => {
    for (const c of ['q-btn', 'q-field__control', 'q-layout', 'q-drawer', 'q-tabs', 'row', 'items-center', 'q-pa-md', 'text-primary', 'bg-primary']) expect(kept, c).toContain(c)
  })

  it('keeps every ending of a class Quasar completes at run time', () => {
    // `q-btn--${design}` (flat, outline, unelevated…), `q-field--${…}` and `q-${type}__inner` with type 'checkbox'.
    for (const c of ['q-btn--flat', 'q-btn--outline', 'q-btn--unelevated', 'q-field--outlined', 'q-field--focused', 'q-checkbox__inner', 'q-checkbox__inner--truthy', 'body--dark']) expect(kept, c).toContain(c)
  })

  it('keeps element rules (the reset and the body styles)', () => {
    const selectors: string[] = []
    postcss.parse(keptCss).walkRules((r) => void selectors.push(r.selector))
    expect(selectors.some((s) => /(^|,)\s*body\s*(,|$)/.test(s))).toBe(true)
    expect(selectors.some((s) => /(^|,)\s*button\s*(,|$)/.test(s))).toBe(true)
  })

  it('leaves out components the app never uses and colours it never names', () => {
    for (const c of ['q-stepper', 'q-tree', 'q-uploader', 'q-carousel', 'q-editor', 'q-fab', 'text-pink-3', 'bg-deep-purple-9']) {
      expect(full, c).toContain(c)
      expect(kept, c).not.toContain(c)
    }
    expect(keptCss.length).toBeLessThan(quasarCss.length * 0.75)
  })
})
