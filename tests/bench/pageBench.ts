// The first route as a person meets it: bytes of JS and CSS it loads, and its largest contentful paint on a throttled
// phone, cold and then warm from the service worker. Built with the real vite config.
import fs from 'node:fs'
import type { Server } from 'node:http'
import type { AddressInfo } from 'node:net'
import path from 'node:path'
import zlib from 'node:zlib'
import express from 'express'
import type { BrowserContext, Page } from 'playwright-core'
import { build } from 'vite'
import { freshContext } from '../helpers/chromium'
import { group, kb, ms, row } from './benchFormat'
import { percentile } from './benchResults'
import { repoRoot } from './rungsProcess'

const SIZE_BUDGET_BYTES = 150 * 1024
const COLD_BUDGET_MS = 1_500
const WARM_BUDGET_MS = 500
const RUNS = 5
// Lighthouse throttling defaults for mobile "slow 4G", from memory: 150 ms RTT, 1.6 Mbps down, 750 kbps up, 4× CPU.
const SLOW_4G = { offline: false, latency: 150, downloadThroughput: (1.6 * 1024 * 1024) / 8, uploadThroughput: (750 * 1024) / 8 }
const CPU_SLOWDOWN = 4

async function buildApp(outDir: string): Promise<void> {
  await build({
    configFile: path.join(repoRoot, 'vite.config.ts'),
    root: path.join(repoRoot, 'client'),
    logLevel: 'warn',
    cacheDir: path.join(outDir, '..', 'appViteCache'),
    build: { outDir, emptyOutDir: true, reportCompressedSize: false },
  })
}

/**
 * Serves the build the way the Rungs server does (hashed assets immutable, everything else re-checked, the shell for any
 * other path), optionally gzip-compressed (level 9) as a compressing proxy in front of it would.
 */
function serveBuild(dir: string, gzip: boolean): Promise<Server> {
  const app = express()
  const cache = new Map<string, Buffer>()
  app.use((req, res) => {
    const wanted = path.normalize(decodeURIComponent(req.path)).replace(/^(\.\.[/\\])+/, '')
    let file = path.join(dir, wanted)
    if (!file.startsWith(dir) || !fs.existsSync(file) || fs.statSync(file).isDirectory()) file = path.join(dir, 'index.html')
    res.setHeader('Cache-Control', file.includes(`${path.sep}assets${path.sep}`) ? 'public, max-age=31536000, immutable' : 'no-cache')
    res.type(path.extname(file) || 'html')
    const body = fs.readFileSync(file)
    if (gzip && /\.(js|css|html|svg|webmanifest|json)$/.test(file)) {
      if (!cache.has(file)) cache.set(file, zlib.gzipSync(body, { level: 9 }))
      res.setHeader('Content-Encoding', 'gzip')
      res.setHeader('Vary', 'Accept-Encoding')
      res.end(cache.get(file))
    } else res.end(body)
  })
  return new Promise((resolve, reject) => {
    const server = app.listen(0, '127.0.0.1', (err?: Error) => (err ? reject(err) : resolve(server)))
  })
}

interface Loaded {
  url: string
  /** Asked for after the page's load event: chunks imported lazily by the router and components as the route renders. */
  afterLoad: boolean
  gzipBytes: number
  rawBytes: number
}

// Work the app defers to idle time (requestIdleCallback: Help now's dialog, the lock screen once a lock is on) is not
// needed to render the first route, so it is measured apart: one load with idle callbacks held back gives what the
// first route needs (and the bench checks that the route did render from that alone), a normal load gives everything,
// and the difference is printed as idle-time loads. The budget is for the first; the full figure is printed beside it.
const HOLD_IDLE = 'window.requestIdleCallback = () => 0;'
// What must be on screen for the first route to count as rendered: the Today page's form and Help now in the header.
// The app's own screen, not index.html's prerendered copy of it (inside .first-screen).
const FIRST_ROUTE_SHOWN = ['#moment-title', '[data-test=help-now]', 'textarea'].map((s) => `#app > .q-layout ${s}`)

/** Every JS and CSS file the page itself loads for `/` before the network goes quiet (the service worker's own fetches are not the page's). */
async function firstRouteFiles(origin: string, holdIdle: boolean): Promise<{ files: Loaded[]; sw: Loaded[]; rendered: boolean }> {
  const browser = await freshContext()
  try {
    if (holdIdle) await browser.context.addInitScript(HOLD_IDLE)
    const page = await browser.context.newPage()
    const pending: Promise<Loaded | undefined>[] = []
    let loaded = false
    page.once('load', () => (loaded = true))
    page.on('response', (res) => {
      const afterLoad = loaded
      const type = res.request().resourceType()
      if (type !== 'script' && type !== 'stylesheet' && !/\.(js|css)(\?|$)/.test(res.url())) return
      pending.push(
        res.body().then(
          (body) => ({ url: new URL(res.url()).pathname, afterLoad, rawBytes: body.length, gzipBytes: zlib.gzipSync(body, { level: 9 }).length }),
          () => undefined,
        ),
      )
    })
    await page.goto(origin + '/', { waitUntil: 'networkidle' })
    await page.waitForTimeout(500)
    const shown = await Promise.all(FIRST_ROUTE_SHOWN.map((s) => page.locator(s).first().isVisible()))
    const all = (await Promise.all(pending)).filter((f): f is Loaded => !!f)
    const isSw = (f: Loaded) => /^\/(sw|workbox-[\w-]+)\.js$/.test(f.url)
    return { files: all.filter((f) => !isSw(f)), sw: all.filter(isSw), rendered: shown.every(Boolean) }
  } finally {
    await browser.close()
  }
}

/** One largest-contentful-paint candidate, as the browser reported it. */
interface LcpCandidate {
  ms: number
  /** Painted area in CSS pixels, as the entry's `size`. */
  size: number
  element: string
  url: string
  /** Inside index.html's static Help now block, which the app replaces. */
  staticBlock: boolean
  /** Inside index.html's prerendered Today (client/build/firstScreenHtml.ts), which the app replaces with its own. */
  prerendered: boolean
}

interface Lcp {
  /** The last candidate's time: the page's LCP. */
  ms: number
  element: string
  /** Every candidate in order, so a run that flips between two elements shows both. */
  candidates: LcpCandidate[]
  fcp: number
  /** Whether the LCP element was in index.html's static block rather than the app's own screen. */
  staticBlock: boolean
  /** Whether it was in index.html's prerendered Today. */
  prerendered: boolean
  /** When the app's own first screen (not index.html's static block) was first painted; 0 when it never was. */
  appMs: number
  controlled: boolean
  phases: Phases
}

/** Where a load's time went, in ms from the navigation's start (Navigation and Resource Timing). */
interface Phases {
  /** index.html fully received. */
  html: number
  /** The first file it asks for: the gap after `html` is the renderer committing the new document. */
  firstAsk: number
  /** The last render-blocking stylesheet or script received. */
  blockingIn: number
  /** Parsing done (domInteractive); from here to FCP is style, layout and paint of the whole screen. */
  parsed: number
}

// The app's first screen counts as painted at the first animation frame after its layout is in the DOM, seen by a
// MutationObserver; index.html's prerendered Today has its layout inside .first-screen, not directly in #app.
const OBSERVE_LCP = `
  window.__lcp = { candidates: [], fcp: 0, appMs: 0 };
  const describe = (el) => el ? el.tagName.toLowerCase() + (el.id ? '#' + el.id : '') + (el.className && typeof el.className === 'string' ? '.' + el.className.trim().split(/\\s+/).slice(0, 2).join('.') : '') + ' "' + (el.textContent || '').trim().replace(/\\s+/g, ' ').slice(0, 40) + '"' : '(removed)';
  new PerformanceObserver((list) => {
    for (const e of list.getEntries()) window.__lcp.candidates.push({ ms: e.startTime, size: e.size, element: describe(e.element), url: e.url || '', staticBlock: !!(e.element && e.element.closest && e.element.closest('.static-fallback')), prerendered: !!(e.element && e.element.closest && e.element.closest('.first-screen')) });
  }).observe({ type: 'largest-contentful-paint', buffered: true });
  new PerformanceObserver((list) => {
    for (const e of list.getEntries()) if (e.name === 'first-contentful-paint') window.__lcp.fcp = e.startTime;
  }).observe({ type: 'paint', buffered: true });
  new MutationObserver((_m, observer) => {
    if (!document.querySelector('#app > .q-layout .q-page')) return;
    observer.disconnect();
    requestAnimationFrame(() => { window.__lcp.appMs = performance.now() });
  }).observe(document, { childList: true, subtree: true });
`

async function throttle(context: BrowserContext, page: Page): Promise<void> {
  const cdp = await context.newCDPSession(page)
  await cdp.send('Network.enable')
  await cdp.send('Network.emulateNetworkConditions', SLOW_4G)
  await cdp.send('Emulation.setCPUThrottlingRate', { rate: CPU_SLOWDOWN })
}

async function readLcp(page: Page): Promise<Lcp> {
  // LCP can still move while the page renders; a quiet network plus a second of calm is taken as settled.
  await page.waitForLoadState('networkidle')
  await page.waitForTimeout(1_000)
  const seen = await page.evaluate(() => {
    const w = window as unknown as { __lcp: { candidates: LcpCandidate[]; fcp: number; appMs: number } }
    const nav = performance.getEntriesByType('navigation')[0] as PerformanceNavigationTiming
    const files = (performance.getEntriesByType('resource') as (PerformanceResourceTiming & { renderBlockingStatus?: string })[]).filter((r) => r.startTime < nav.domInteractive)
    const phases = {
      html: nav.responseEnd,
      firstAsk: files.length ? Math.min(...files.map((r) => r.startTime)) : 0,
      blockingIn: Math.max(0, ...files.filter((r) => r.renderBlockingStatus === 'blocking').map((r) => r.responseEnd)),
      parsed: nav.domInteractive,
    }
    return { ...w.__lcp, controlled: !!navigator.serviceWorker?.controller, phases }
  })
  const last = seen.candidates[seen.candidates.length - 1]
  return { ...seen, ms: last?.ms ?? 0, element: last?.element ?? '(no candidate)', staticBlock: last?.staticBlock ?? false, prerendered: last?.prerendered ?? false }
}

/**
 * One fresh profile: a cold load, then, once the service worker is active, a warm reload with the same throttling, and
 * one more warm load with no throttling at all (information only).
 */
async function lcpRun(origin: string): Promise<{ cold: Lcp; warm: Lcp; warmFast: Lcp }> {
  const browser = await freshContext()
  try {
    await browser.context.addInitScript(OBSERVE_LCP)
    const page = await browser.context.newPage()
    await throttle(browser.context, page)
    await page.goto(origin + '/', { waitUntil: 'load' })
    const cold = await readLcp(page)
    // Precaching runs in the worker, which the page's emulation does not slow; it must finish before the warm load.
    await page.evaluate(async () => {
      await navigator.serviceWorker.ready
    })
    const warmPage = await browser.context.newPage()
    await throttle(browser.context, warmPage)
    await page.close()
    await warmPage.goto(origin + '/', { waitUntil: 'load' })
    const warm = await readLcp(warmPage)
    const fastPage = await browser.context.newPage()
    await warmPage.close()
    await fastPage.goto(origin + '/', { waitUntil: 'load' })
    const warmFast = await readLcp(fastPage)
    return { cold, warm, warmFast }
  } finally {
    await browser.close()
  }
}

const median = (xs: number[]) => percentile(xs, 50)

export async function benchPages(tmp: string, onClose: (close: () => Promise<void>) => void): Promise<string> {
  const outDir = path.join(tmp, 'appDist')
  const buildStart = performance.now()
  await buildApp(outDir)
  const buildMs = performance.now() - buildStart
  const gz = await serveBuild(outDir, true)
  const plain = await serveBuild(outDir, false)
  for (const s of [gz, plain]) onClose(() => new Promise<void>((resolve) => {
    s.closeAllConnections()
    s.close(() => resolve())
  }))
  const origin = (s: Server) => `http://127.0.0.1:${(s.address() as AddressInfo).port}`

  const { files, sw, rendered } = await firstRouteFiles(origin(gz), true)
  const everything = await firstRouteFiles(origin(gz), false)
  const sum = (xs: Loaded[]) => xs.reduce((n, f) => n + f.gzipBytes, 0)
  const total = sum(files)
  const raw = files.reduce((n, f) => n + f.rawBytes, 0)
  const biggest = [...files].sort((a, b) => b.gzipBytes - a.gzipBytes)
  const needed = new Set(files.map((f) => f.url))
  const idleLoads = everything.files.filter((f) => !needed.has(f.url)).sort((a, b) => b.gzipBytes - a.gzipBytes)

  const runs: { cold: Lcp; warm: Lcp; warmFast: Lcp }[] = []
  for (let i = 0; i < RUNS; i++) runs.push(await lcpRun(origin(gz)))
  const plainRuns: Lcp[] = []
  for (let i = 0; i < RUNS; i++) plainRuns.push((await lcpRun(origin(plain))).cold)
  const cold = median(runs.map((r) => r.cold.ms))
  const warm = median(runs.map((r) => r.warm.ms))
  const coldPlain = median(plainRuns.map((r) => r.ms))
  const list = (xs: number[]) => xs.map((x) => ms(x)).join(', ')
  const phases = (lcps: Lcp[]) => {
    const at = (k: keyof Phases) => ms(median(lcps.map((r) => r.phases[k])))
    return row('  where the time went (medians, ms from the start)', '', `   index.html in ${at('html')}, first file asked for ${at('firstAsk')}, render-blocking files in ${at('blockingIn')}, parsed ${at('parsed')}, FCP ${ms(median(lcps.map((r) => r.fcp)))}`)
  }
  // Each run's candidates in order ("time ms size px² element"), the last one being the LCP.
  const perRun = (label: string, lcps: Lcp[]) =>
    lcps.flatMap((r, i) => [
      `    ${label} run ${i + 1}: FCP ${ms(r.fcp)} ms, app's first screen ${r.appMs ? `${ms(r.appMs)} ms` : 'never'}, LCP candidates:`,
      ...r.candidates.map((c) => `      ${ms(c.ms).padStart(6)} ms ${group(c.size).padStart(8)} px²  ${c.prerendered ? '(prerendered) ' : ''}${c.element.slice(0, 60)}${c.url ? ` ${c.url}` : ''}`),
    ])
  return [
    `First route (/) of the real build (vite.config.ts, built in ${ms(buildMs)} ms), fresh Chromium profile, 390×844`,
    row(`JS + CSS the first route (/) needs to render (${files.length} files, gzip level 9 of each body)`, kb(total), `   ${kb(raw)} uncompressed   budget ≤ ${kb(SIZE_BUDGET_BYTES)}${total > SIZE_BUDGET_BYTES ? '   MISSES BUDGET' : ''}`),
    row('  the route rendered from these alone (Today\'s form and Help now shown, idle callbacks held back)', rendered ? 'yes' : 'NO: the figure above is not the whole first route'),
    row('  of which asked for before the load event / after it (lazy route chunks)', `${kb(sum(files.filter((f) => !f.afterLoad)))} / ${kb(sum(files.filter((f) => f.afterLoad)))}`),
    ...biggest.slice(0, 8).map((f) => row(`  ${f.url}${f.afterLoad ? ' (after load)' : ''}`, kb(f.gzipBytes), `   ${kb(f.rawBytes)} uncompressed`)),
    ...(files.length > 8 ? [row(`  ${files.length - 8} more files`, kb(sum(biggest.slice(8))))] : []),
    row(`then idle-time loads (${idleLoads.length} files, not needed to render: prefetches such as Help now's dialog)`, kb(sum(idleLoads)), `   largest ${idleLoads.slice(0, 3).map((f) => `${f.url} ${kb(f.gzipBytes)}`).join(', ') || 'none'}`),
    row('JS + CSS the page loads for / in all, idle-time loads included', kb(sum(everything.files)), `   ${everything.files.length} files`),
    row('  then the service worker script (sw.js + workbox, not counted)', kb(sum(sw))),
    '',
    `Largest contentful paint, ${CPU_SLOWDOWN}× CPU throttle, slow 4G (150 ms RTT, 1.6 Mbps down, 750 kbps up; Lighthouse defaults, from memory); median of ${RUNS}`,
    row('LCP, cold load (fresh profile; served gzip-compressed)', `${ms(cold)} ms`, `   runs ${list(runs.map((r) => r.cold.ms))}   budget ≤ ${ms(COLD_BUDGET_MS)} ms${cold > COLD_BUDGET_MS ? '   MISSES BUDGET' : ''}`),
    row("  app's first screen painted (median)", `${ms(median(runs.map((r) => r.cold.appMs)))} ms`),
    row("  runs whose LCP element is index.html's prerendered Today, painted before the app (which then replaced it with no larger element)", `${runs.filter((r) => r.cold.prerendered).length} of ${RUNS}`),
    row("  runs whose LCP element is index.html's static Help now block", `${runs.filter((r) => r.cold.staticBlock).length} of ${RUNS}`),
    phases(runs.map((r) => r.cold)),
    ...perRun('cold', runs.map((r) => r.cold)),
    row('LCP, warm load from the service worker', `${ms(warm)} ms`, `   runs ${list(runs.map((r) => r.warm.ms))}   budget ≤ ${WARM_BUDGET_MS} ms${warm > WARM_BUDGET_MS ? '   MISSES BUDGET' : ''}`),
    row('  controlled by the service worker in every warm run', runs.every((r) => r.warm.controlled) ? 'yes' : 'no'),
    row("  app's first screen painted (median)", `${ms(median(runs.map((r) => r.warm.appMs)))} ms`),
    row("  runs whose LCP element is index.html's prerendered Today", `${runs.filter((r) => r.warm.prerendered).length} of ${RUNS}`),
    row("  runs whose LCP element is index.html's static Help now block", `${runs.filter((r) => r.warm.staticBlock).length} of ${RUNS}`),
    phases(runs.map((r) => r.warm)),
    ...perRun('warm', runs.map((r) => r.warm)),
    row('For information only, not a budget: LCP, warm load from the service worker with NO CPU or network throttle', `${ms(median(runs.map((r) => r.warmFast.ms)))} ms`, `   runs ${list(runs.map((r) => r.warmFast.ms))}   app's first screen (median) ${ms(median(runs.map((r) => r.warmFast.appMs)))} ms`),
    row('LCP, cold load served uncompressed (for comparison: the Rungs server gzips its own files)', `${ms(coldPlain)} ms`, `   runs ${list(plainRuns.map((r) => r.ms))}`),
    ...perRun('uncompressed cold', plainRuns),
    '',
  ].join('\n')
}
