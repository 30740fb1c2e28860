// Storage speed in a real Chromium page: builds tests/bench/browser, serves it on loopback, runs it, prints figures.
// Then the outbox drain: the real Rungs server serves the same build, so the page and the API share one origin.
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
import { loadConfig } from '../../server/config/env'
import { createLogger, type Logger } from '../../server/log/logger'
import { startServer, type Running } from '../../server/start'
import { freshContext } from '../helpers/chromium'
import { group, misses, ms, row, trio } from './benchFormat'
import { spread, type BenchResults, type OutboxResults, type SummaryBenchResults } from './benchResults'
import { benchCaseload } from './caseloadBench'
import { benchFault } from './faultBench'
import { benchLoad } from './loadBench'
import { benchPages } from './pageBench'
import type { RungsProcess } from './rungsProcess'

const SAVE_RATIO_BUDGET = 2
const SEARCH_BUDGET_MS = 30
// Well under the two-minute limit on two cores; a hung page must not hold the run open.
const DEADLINE_MS = 110_000
const OUTBOX_ITEMS = 1_000
// The demo person (server/db/seed.ts), linked with the demo therapist.
const PERSON = { email: 'robin.ashdown@example.org', password: 'demo-person-orchard' }

const pageRoot = fileURLToPath(new URL('./browser', import.meta.url))


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
    build: {
      outDir,
      emptyOutDir: true,
      reportCompressedSize: false,
      rollupOptions: { input: { index: path.join(pageRoot, 'index.html'), outbox: path.join(pageRoot, 'outbox.html'), summary: path.join(pageRoot, 'summary.html') } },
    },
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

function withDeadline<T>(work: Promise<T>, what: string, deadlineMs = DEADLINE_MS): Promise<T> {
  let timer: NodeJS.Timeout | undefined
  const deadline = new Promise<never>((_resolve, reject) => {
    timer = setTimeout(() => reject(new Error(`${what} did not finish within ${deadlineMs / 1000} s`)), deadlineMs)
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

function summaryReport(r: SummaryBenchResults): string {
  return [
    `Appointment summary PDF in the page (${r.days} days: ${group(r.entries)} moments and tugs, ${r.measures} questionnaires; A4, Lora subset embedded)`,
    row(`90-day summary PDF build (median / p95 / max of ${r.runs}, after one untimed build)`, trio(r.total)),
    row('  of which reading the period from Dexie (median / p95 / max)', trio(r.gather)),
    row('  PDF size and pages', `${(r.bytes / 1024).toFixed(0)} kB, ${r.pages} pages`),
    '',
  ].join('\n')
}

/** What the server's own request log said about each share PUT (handler time, from the request to the response's end). */
function serverLog(): { log: Logger; putMs: number[]; other: string[] } {
  const putMs: number[] = []
  const other: string[] = []
  const log = (line: string) => {
    const m = /^PUT \/api\/links\/[^/]+\/shares\/\S+ (\d{3}) ([\d.]+)ms$/.exec(line)
    if (m) putMs.push(Number(m[2]))
    else if (!/^(GET|POST|PUT|DELETE) /.test(line)) other.push(line)
  }
  // pino writes one JSON object per line; its msg is "METHOD /path status Nms" for a request.
  const destination = { write: (json: string) => log(String((JSON.parse(json) as { msg?: unknown }).msg ?? '')) }
  return { log: createLogger({ level: 'info', destination }), putMs, other }
}

interface OutboxCheck {
  stored: number
  duplicates: number
  /** Ids the page created that the server does not hold. */
  missing: number
  /** Rows of the link whose entry the page did not create (the demo's own shares, say). */
  others: number
  /** Stored rows not at version 1 or withdrawn. */
  wrong: number
}

/** Reads the server's database directly: one row per entry the page created, at version 1, and nothing twice. */
async function checkShares(running: Running, r: OutboxResults): Promise<OutboxCheck> {
  const rows = await running.deps.models.SharedEntry.findAll({ where: { linkId: r.linkId }, attributes: ['entryId', 'version', 'withdrawnAt'] })
  const ours = new Set(r.entryIds)
  const mine = rows.filter((row) => ours.has(row.entryId))
  const distinct = new Set(mine.map((row) => row.entryId))
  return {
    stored: distinct.size,
    duplicates: mine.length - distinct.size,
    missing: ours.size - distinct.size,
    others: rows.length - mine.length,
    wrong: mine.filter((row) => row.version !== 1 || row.withdrawnAt !== null).length,
  }
}

function outboxReport(r: OutboxResults, check: OutboxCheck, serverPutMs: number[]): string {
  const sent = r.drains.reduce((n, d) => n + d.sent, 0)
  const deferred = r.drains.reduce((n, d) => n + d.deferred, 0)
  const failed = r.drains.reduce((n, d) => n + d.failed, 0)
  const server = serverPutMs.length ? spread(serverPutMs) : undefined
  const serverSum = serverPutMs.reduce((a, b) => a + b, 0)
  const share = (part: number) => `${((100 * part) / r.drainMs).toFixed(0)} %`
  const ok = check.stored === r.count && check.duplicates === 0 && check.missing === 0 && check.wrong === 0 && r.left === 0 && r.sharedLocally === r.count
  const lines = [
    `Outbox drain against the real Rungs server on loopback (demo person, ${group(r.count)} entries, one share each)`,
    `  timer: not isolated (0.1 ms precision); the page is served by the Rungs server, which sets no COEP header`,
    row(`Create ${group(r.count)} entries (createEntry, one by one)`, `${ms(r.createMs)} ms`),
    row(`Queue ${group(r.count)} shares (queueShare, one by one; ${group(r.queued)} outbox rows)`, `${ms(r.queueMs)} ms`),
    row(`Drain a ${group(r.count)}-item outbox (drainOutbox until empty: ${r.drains.length} call${r.drains.length === 1 ? '' : 's'})`, `${ms(r.drainMs)} ms`, `   ${group((1000 * sent) / r.drainMs)} items/s`),
    row('  per item, drain time / items', `${ms(r.drainMs / Math.max(1, sent))} ms`),
    ...(r.roundTrip ? [row(`  share PUT round trip in the page (median / p95 / max of ${group(r.requests)})`, trio(r.roundTrip), `   sum ${group(r.roundTripSumMs)} ms, ${share(r.roundTripSumMs)} of the drain`)] : []),
    ...(server ? [row(`  of which the server's handler (median / p95 / max of ${group(serverPutMs.length)})`, trio(server), `   sum ${group(serverSum)} ms, ${share(serverSum)} of the drain`)] : []),
    ...(r.between ? [row('  device work between one response and the next PUT (median / p95 / max)', trio(r.between), `   sum ${group(r.drainMs - r.roundTripSumMs)} ms, ${share(r.drainMs - r.roundTripSumMs)} of the drain`)] : []),
    row('  drain reports (sent / deferred / failed; outbox rows left)', `${group(sent)} / ${deferred} / ${failed}; ${r.left} left`),
    row(`Server database for the link`, `${group(check.stored)} stored, ${check.duplicates} duplicates`, check.others ? `   (+${check.others} rows not from this run)` : ''),
    row(`Device: entries whose share reads 'shared' at their version`, `${group(r.sharedLocally)}`),
    ...(ok
      ? []
      : [
          `  MISMATCH: expected ${r.count} stored, 0 duplicates, 0 missing, all at version 1, ${r.count} shared on the device and an empty outbox;` +
            ` got ${check.stored} stored, ${check.duplicates} duplicates, ${check.missing} missing, ${check.wrong} at another version or withdrawn,` +
            ` ${r.sharedLocally} shared on the device, ${r.left} outbox rows left`,
        ]),
    '',
  ]
  return lines.join('\n')
}

async function benchOutbox(context: Awaited<ReturnType<typeof freshContext>>['context'], outDir: string, tmp: string, hold: (r: Running) => void): Promise<string> {
  const { log, putMs } = serverLog()
  const dataDir = path.join(tmp, 'serverData')
  fs.mkdirSync(dataDir)
  const env = { NODE_ENV: 'test', DATA_DIR: dataDir, PORT: '0', SCRYPT_COST: '1024', SEED_DEMO: 'true', SIGNIN_LIMIT: '1000', RESET_LIMIT: '1000' }
  // The request log is on only to read each PUT's handler time; nothing of it is printed.
  const running = await startServer(loadConfig(env, { clientDir: outDir, host: '127.0.0.1', logRequests: true }), log)
  hold(running)
  const origin = `http://127.0.0.1:${(running.server.address() as AddressInfo).port}`
  const page = await context.newPage()
  page.on('pageerror', (e) => console.error(`outbox page error: ${e.message}`))
  page.on('console', (m) => m.type() === 'error' && console.error(`outbox page console: ${m.text()}`))
  await page.goto(origin + '/outbox.html')
  const results = await withDeadline(
    page.evaluate(
      ([email, password, count]) => (globalThis as unknown as { runOutboxBench(e: string, p: string, n: number): Promise<OutboxResults> }).runOutboxBench(email, password, count),
      [PERSON.email, PERSON.password, OUTBOX_ITEMS] as const,
    ),
    'The outbox bench page',
    180_000,
  )
  await page.close()
  return outboxReport(results, await checkShares(running, results), putMs)
}

const SECTIONS = ['storage', 'summary', 'outbox', 'pages', 'caseload', 'load', 'fault'] as const
type Section = (typeof SECTIONS)[number]

/** `npm run bench` runs every section; `npm run bench -- load fault` runs only those. */
function chosenSections(): Set<Section> {
  const asked = process.argv.slice(2).filter((a) => !a.startsWith('-'))
  const unknown = asked.filter((a) => !(SECTIONS as readonly string[]).includes(a))
  if (unknown.length) throw new Error(`Unknown bench section ${unknown.join(', ')}; choose from ${SECTIONS.join(', ')}`)
  return new Set((asked.length ? asked : SECTIONS) as Section[])
}

async function main(): Promise<void> {
  const sections = chosenSections()
  const runStart = performance.now()
  const tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'rungsBench-'))
  let server: Server | undefined
  let rungs: Running | undefined
  let child: RungsProcess | undefined
  let browser: Awaited<ReturnType<typeof freshContext>> | undefined
  const closers: (() => Promise<void>)[] = []
  const cleanUp = async () => {
    if (child) await child.kill9().catch(() => undefined)
    for (const close of closers) await close().catch(() => undefined)
    await browser?.close().catch(() => undefined)
    await rungs?.close().catch(() => undefined)
    server?.closeAllConnections()
    await new Promise((resolve) => (server ? server.close(resolve) : resolve(undefined)))
    fs.rmSync(tmp, { recursive: true, force: true })
  }
  const onSignal = () => void cleanUp().finally(() => process.exit(130))
  process.once('SIGINT', onSignal)
  process.once('SIGTERM', onSignal)
  const track = (p: RungsProcess | undefined) => (child = p)
  try {
    if (sections.has('storage') || sections.has('summary') || sections.has('outbox')) {
      const outDir = path.join(tmp, 'dist')
      const buildStart = performance.now()
      await buildPage(outDir)
      const buildMs = performance.now() - buildStart
      server = await serve(outDir)
      const origin = `http://127.0.0.1:${(server.address() as AddressInfo).port}`

      browser = await freshContext({ width: 800, height: 600 })
      // Loopback only: anything else the page or browser asks for is refused.
      // The Rungs server's origin joins the list once it is listening.
      const allowed = [origin + '/']
      await browser.context.route('**/*', (route) => (allowed.some((o) => route.request().url().startsWith(o)) ? route.continue() : route.abort()))
      if (sections.has('storage')) {
        const page = await browser.context.newPage()
        page.on('pageerror', (e) => console.error(`page error: ${e.message}`))
        page.on('console', (m) => m.type() === 'error' && console.error(`page console: ${m.text()}`))
        await page.goto(origin + '/')
        const results = await withDeadline(
          page.evaluate(() => (globalThis as unknown as { runBench(): Promise<BenchResults> }).runBench()),
          'The bench page',
        )
        await page.close()
        console.log(report(results, buildMs))
      }
      if (sections.has('summary')) {
        const summaryPage = await browser.context.newPage()
        summaryPage.on('pageerror', (e) => console.error(`summary page error: ${e.message}`))
        await summaryPage.goto(origin + '/summary.html')
        const summary = await withDeadline(
          summaryPage.evaluate(() => (globalThis as unknown as { runSummaryBench(): Promise<SummaryBenchResults> }).runSummaryBench()),
          'The summary bench page',
          90_000,
        )
        await summaryPage.close()
        console.log(summaryReport(summary))
      }
      if (sections.has('outbox')) {
        console.log(
          await benchOutbox(browser.context, outDir, tmp, (r) => {
            rungs = r
            allowed.push(`http://127.0.0.1:${(r.server.address() as AddressInfo).port}/`)
          }),
        )
        await rungs?.close()
        rungs = undefined
      }
      await browser.close()
      browser = undefined
    }
    if (sections.has('pages')) console.log(await withDeadline(benchPages(tmp, (close) => closers.push(close)), 'The first-route and LCP bench', 240_000))
    if (sections.has('caseload')) console.log(await withDeadline(benchCaseload(tmp, track, (close) => closers.push(close)), 'The caseload bench', 120_000))
    if (sections.has('load')) console.log(await withDeadline(benchLoad(tmp, track), 'The load bench', 150_000))
    if (sections.has('fault')) console.log(await withDeadline(benchFault(tmp, track), 'The fault bench', 150_000))
    console.log(`Bench finished in ${((performance.now() - runStart) / 1000).toFixed(0)} s (sections: ${[...sections].join(', ')})`)
  } finally {
    await cleanUp()
    process.off('SIGINT', onSignal)
    process.off('SIGTERM', onSignal)
  }
}

await main()
