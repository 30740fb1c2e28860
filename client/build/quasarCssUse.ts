// Which of Quasar's prebuilt CSS the app can use, decided at build time from the sources: the app's own files and the
// Quasar modules they reach. Quasar ships one stylesheet for every component it has (about 35 KB gzip); the app uses a
// few dozen, so the rest is left out of the first screen's CSS.
import fs from 'node:fs'
import { createRequire } from 'node:module'
import path from 'node:path'

const require = createRequire(import.meta.url)
const quasarRoot = path.dirname(require.resolve('quasar/package.json'))

function filesUnder(dir: string, exts: RegExp, skip: (p: string) => boolean): string[] {
  return fs.readdirSync(dir, { withFileTypes: true }).flatMap((d) => {
    const p = path.join(dir, d.name)
    if (skip(p)) return []
    if (d.isDirectory()) return filesUnder(p, exts, skip)
    return exts.test(d.name) ? [p] : []
  })
}

const pascal = (kebab: string) => kebab.split('-').map((w) => w.charAt(0).toUpperCase() + w.slice(1)).join('')

/** Quasar names (components, directives, plugins) the app's files mention: <q-btn>, QBtn, v-close-popup, Notify. */
function quasarNamesIn(sources: string[], importMap: Record<string, string>): string[] {
  const names = new Set<string>(['Quasar'])
  for (const text of sources) {
    for (const [token] of text.matchAll(/[A-Za-z][\w-]*/g)) {
      const candidates = [token, pascal(token), token.startsWith('v-') ? pascal(token.slice(2)) : '']
      for (const c of candidates) if (c && Object.hasOwn(importMap, c) && !c.includes('.')) names.add(c)
    }
  }
  return [...names]
}

/** The Quasar source files reached from `seeds` by relative static and dynamic imports. */
function reachedQuasarFiles(seeds: string[]): Map<string, string> {
  const seen = new Map<string, string>()
  const queue = [...seeds]
  while (queue.length) {
    const file = queue.pop()!
    if (seen.has(file) || !fs.existsSync(file)) continue
    const text = fs.readFileSync(file, 'utf8')
    seen.set(file, text)
    for (const m of text.matchAll(/(?:from\s*|import\s*\(\s*|import\s+)['"](\.{1,2}\/[^'"]+)['"]/g)) {
      const target = path.resolve(path.dirname(file), m[1]!)
      queue.push(target.endsWith('.js') ? target : `${target}.js`)
    }
  }
  return seen
}

export interface QuasarCssUse {
  /** Every text a used class name can come from: the app's files and the Quasar modules they reach. */
  content: string[]
  /** Class-name stems the code completes at run time (`q-btn--${design}`), kept with every ending. */
  dynamicPrefixes: string[]
  /**
   * Words Quasar quotes and then builds a class from, as in `q-${type}__inner` with type 'checkbox': every class of the
   * `q-<word>` family is kept for each.
   */
  quotedWords: string[]
  /** How many Quasar modules were reached, for the build log. */
  quasarModules: number
}

/** Class-name stems written as a string that is then completed: `'q-field--' + x`, `` `q-btn--${x}` ``. */
function dynamicPrefixesIn(texts: string[]): string[] {
  const found = new Set<string>()
  for (const text of texts) {
    for (const m of text.matchAll(/([A-Za-z][\w-]*-)(?:\$\{|['"`]\s*\+)/g)) found.add(m[1]!)
  }
  return [...found].sort()
}

export function quasarCssUse(clientDir: string): QuasarCssUse {
  const own = filesUnder(clientDir, /\.(vue|ts|html)$/, (p) => p === path.join(clientDir, 'build'))
  const ownTexts = own.map((f) => fs.readFileSync(f, 'utf8'))
  const importMap = JSON.parse(fs.readFileSync(path.join(quasarRoot, 'dist/transforms/import-map.json'), 'utf8')) as Record<string, string>
  const seeds = quasarNamesIn(ownTexts, importMap).map((n) => path.join(quasarRoot, importMap[n]!))
  const reached = reachedQuasarFiles(seeds)
  const content = [...ownTexts, ...reached.values()]
  const quotedWords = new Set<string>()
  for (const text of reached.values()) for (const m of text.matchAll(/['"`]([a-z][a-z-]*)['"`]/g)) quotedWords.add(m[1]!)
  return { content, dynamicPrefixes: dynamicPrefixesIn(content), quotedWords: [...quotedWords].sort(), quasarModules: reached.size }
}
