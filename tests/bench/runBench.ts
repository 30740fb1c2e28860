// Storage speed in a real Chromium page: builds tests/bench/browser, serves it on loopback, runs it, prints figures.
// It never asserts a timing; a figure over its budget is marked, and the run still exits 0.
import fs from 'node:fs'
import type { Server } from 'node:http'
import type { AddressInfo } from 'node:net'
import os from 'node:os'
import path from 'node:path'
import { fileURLToPath } from 'node:url'
import express from 'express'
import { build } from 'vite'
import viteConfig from '../../vite.config'
import { freshContext } from '../helpers/chromium'
import type { BenchResults, Spread } from './benchResults'

const SAVE_RATIO_BUDGET = 2
const SEARCH_BUDGET_MS = 30
// Well under the two-minute limit on two cores; a hung page must not hold the run open.
const DEADLINE_MS = 110_000

const pageRoot = fileURLToPath(new URL('./browser', import.meta.url))

const group = (n: number) => String(Math.round(n)).replace(/\B(?=(\d{3})+(?!\d))/g, ' ')
const ms = (n: number) => (n >= 100 ? group(n) : n.toFixed(n >= 10 ? 1 : 2))
const trio = (s: Spread) => `${ms(s.median)} / ${ms(s.p95)} / ${ms(s.max)} ms`
const misses = (over: boolean) => (over ? '   MISSES BUDGET' : '')
const row = (label: string, figure: string, rest = '') => `  ${label.padEnd(72)} ${figure.padStart(22)}${rest}`

async function buildPage(outDir: string): Promise<void> {
  await build({
    configFile: false,
    root: pageRoot,
    base: './',
    mode: 'production',
    logLevel: 'warn',
    publicDir: false,
    cacheDir: path.join(outDir, '..', 'viteCache'),
    // Only the aliases: the page imports plain TypeScript, and the PWA plugin would register a service worker.
    resolve: { alias: viteConfig.resolve?.alias },
    build: { outDir, emptyOutDir: true, reportCompressedSize: false },
  })
}

function serve(dir: string): Promise<Server> {
  const app = express()
  // Cross-origin isolation gives performance.now() microsecond precision instead of a tenth of a millisecond.
  app.use((_req, res, next) => {
    res.set({ 'Cross-Origin-Opener-Policy': 'same-origin', 'Cross-Origin-Embedder-Policy': 'require-corp' })
    next()
  })
  app.use(express.static(dir))
  return new Promise((resolve, reject) => {
    const server = app.listen(0, '127.0.0.1', (err?: Error) => (err ? reject(err) : resolve(server)))
  })
}

function withDeadline<T>(work: Promise<T>, what: string): Promise<T> {
  let timer: NodeJS.Timeout | undefined
  const deadline = new Promise<never>((_resolve, reject) => {
    timer = setTimeout(() => reject(new Error(`${what} did not finish within ${DEADLINE_MS / 1000} s`)), DEADLINE_MS)
  })
  return Promise.race([work, deadline]).finally(() => clearTimeout(timer))
}

function report(r: BenchResults, buildMs: number): string {
  const { save, generate: g, search, listAll } = r
  const searchOver = search.warm.max > SEARCH_BUDGET_MS
  const lines = [
    '',
    `Rungs storage bench   ${r.userAgent.match(/(?:Headless)?Chrome\/[\d.]+/)?.[0] ?? r.userAgent}   page built in ${group(buildMs)} ms`,
    `  timer: ${r.crossOriginIsolated ? 'cross-origin isolated (µs precision)' : 'not isolated (0.1 ms precision)'}; medians and p95 are nearest-rank`,
    '',
    `Saves, each awaited before the next (${save.count} of each, after 10 warm-up, interleaved)`,
    row(`Dexie entry save (median of ${save.count})`, `${ms(save.dexie.median)} ms`, `   raw IndexedDB put ${ms(save.rawIndexed.median)} ms   ratio ${save.ratio.toFixed(2)}   budget ≤ ${SAVE_RATIO_BUDGET}${misses(save.ratio > SAVE_RATIO_BUDGET)}`),
    row(`Dexie entry save (p95 of ${save.count})`, `${ms(save.dexie.p95)} ms`, `   raw IndexedDB put ${ms(save.rawIndexed.p95)} ms   ratio ${(save.dexie.p95 / save.rawIndexed.p95).toFixed(2)}`),
    row('  raw put into a store with the same indexes (median / p95 / max)', trio(save.rawIndexed)),
    row('  raw put into a store with no indexes (median / p95 / max)', trio(save.rawPlain)),
    row('  Dexie entry save (median / p95 / max)', trio(save.dexie)),
    row(`Dexie entry save with ${group(g.count)} entries present (median / p95 / max of 50)`, trio(r.saveWhenFull)),
    '',
    `Journal of ${group(g.count)} entries (${group(g.moments)} moments, ${group(g.tugs)} tugs, ${group(g.distinctWords)} distinct words, two years)`,
    row('Build rows (generate, schema parse, entryWords)', `${ms(g.buildMs)} ms`),
    row('db.entries.bulkAdd', `${ms(g.bulkAddMs)} ms`),
    row('Bulk generation in all', `${ms(g.buildMs + g.bulkAddMs)} ms`),
    ...(r.storageBytes !== undefined ? [row('Origin storage in use (navigator.storage.estimate)', `${(r.storageBytes / 1024 / 1024).toFixed(1)} MB`)] : []),
    '',
    `Searches (idle ${r.settleMs / 1000} s after the bulk add first, so the store's settling is not timed)`,
    row(`Search over ${group(g.count)} entries (median / p95 / max of ${search.queries.length} queries)`, trio(search.warm), `   budget ≤ ${SEARCH_BUDGET_MS} ms${misses(searchOver)}`),
    row('  first run of each query (median / p95 / max)', trio(search.cold), misses(search.cold.max > SEARCH_BUDGET_MS)),
    row(`List all ${group(listAll.rows)} (newest first; median / p95 / max of 5)`, trio(listAll.warm)),
    row('  first run', `${ms(listAll.coldMs)} ms`),
    '',
    `  ${'query'.padEnd(44)} ${'hits'.padStart(6)} ${`ms (median of ${search.rounds})`.padStart(18)} ${'first run'.padStart(10)}`,
    ...search.queries.map((q) => `  ${q.label.padEnd(44)} ${group(q.hits).padStart(6)} ${ms(q.ms).padStart(18)} ${ms(q.coldMs).padStart(10)}${misses(q.ms > SEARCH_BUDGET_MS)}`),
    '',
  ]
  return lines.join('\n')
}

async function main(): Promise<void> {
  const tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'rungsBench-'))
  let server: Server | undefined
  let browser: Awaited<ReturnType<typeof freshContext>> | undefined
  const cleanUp = async () => {
    await browser?.close().catch(() => undefined)
    server?.closeAllConnections()
    await new Promise((resolve) => (server ? server.close(resolve) : resolve(undefined)))
    fs.rmSync(tmp, { recursive: true, force: true })
  }
  const onSignal = () => void cleanUp().finally(() => process.exit(130))
  process.once('SIGINT', onSignal)
  process.once('SIGTERM', onSignal)
  try {
    const outDir = path.join(tmp, 'dist')
    const buildStart = performance.now()
    await buildPage(outDir)
    const buildMs = performance.now() - buildStart
    server = await serve(outDir)
    const origin = `http://127.0.0.1:${(server.address() as AddressInfo).port}`

    browser = await freshContext({ width: 800, height: 600 })
    // Loopback only: anything else the page or browser asks for is refused.
    await browser.context.route('**/*', (route) => (route.request().url().startsWith(origin + '/') ? route.continue() : route.abort()))
    const page = await browser.context.newPage()
    page.on('pageerror', (e) => console.error(`page error: ${e.message}`))
    page.on('console', (m) => m.type() === 'error' && console.error(`page console: ${m.text()}`))
    await page.goto(origin + '/')
    const results = await withDeadline(
      page.evaluate(() => (globalThis as unknown as { runBench(): Promise<BenchResults> }).runBench()),
      'The bench page',
    )
    console.log(report(results, buildMs))
  } finally {
    await cleanUp()
    process.off('SIGINT', onSignal)
    process.off('SIGTERM', onSignal)
  }
}

await main()
