import { freshContext } from './helpers/chromium'
const origin = 'http://127.0.0.1:4410'
async function throttle(cdp: any) { await cdp.send('Network.enable'); await cdp.send('Network.emulateNetworkConditions', { offline: false, latency: 150, downloadThroughput: (1.6 * 1024 * 1024) / 8, uploadThroughput: (750 * 1024) / 8 }); await cdp.send('Emulation.setCPUThrottlingRate', { rate: 4 }) }
const b = await freshContext()
const page = await b.context.newPage(); await throttle(await b.context.newCDPSession(page))
await page.goto(origin + '/', { waitUntil: 'load' }); await page.waitForTimeout(3000)
await page.evaluate(async () => { await navigator.serviceWorker.ready })
const warm = await b.context.newPage(); const cdp = await b.context.newCDPSession(warm); await throttle(cdp); await page.close()
const events: any[] = []
cdp.on('Tracing.dataCollected', (d: any) => events.push(...d.value))
const done = new Promise((r) => cdp.once('Tracing.tracingComplete', r))
await cdp.send('Tracing.start', { categories: 'devtools.timeline,blink.user_timing,loading,disabled-by-default-devtools.timeline', transferMode: 'ReportEvents' })
await warm.goto(origin + '/', { waitUntil: 'load' }); await warm.waitForTimeout(1500)
await cdp.send('Tracing.end'); await done
const nav = events.find((e) => e.name === 'navigationStart' || e.name === 'NavigationStart' ) 
const t0 = Math.min(...events.filter((e) => e.name === 'navigationStart').map((e) => e.ts))
const top = events.filter((e) => e.ph === 'X' && e.dur > 8000 && ['RunTask','ParseHTML','ParseAuthorStyleSheet','UpdateLayoutTree','Layout','Paint','EvaluateScript','v8.compile','FunctionCall','v8.run','CommitLoad','ResourceSendRequest','Document::updateStyleAndLayout', 'PrePaint', 'Commit'].includes(e.name))
for (const e of top.sort((a, b) => a.ts - b.ts)) if ((e.ts - t0) / 1000 < 900) console.log(((e.ts - t0) / 1000).toFixed(0).padStart(5), (e.dur / 1000).toFixed(1).padStart(6), e.name, e.tid, JSON.stringify(e.args?.data ?? {}).slice(0, 100))
const main = top.find((e) => e.dur > 300000)
if (main) for (const e of events.filter((x) => x.tid === main.tid && x.ts >= main.ts && x.ts < main.ts + main.dur && x.ph === 'X' && x.dur > 3000).sort((a, b) => a.ts - b.ts)) console.log('   in', ((e.ts - t0) / 1000).toFixed(0), (e.dur / 1000).toFixed(1), e.name, JSON.stringify(e.args?.data ?? {}).slice(0, 120))
for (const e of events.filter((e) => /firstContentfulPaint|largestContentfulPaint::Candidate|firstPaint|MarkDOMContent/.test(e.name))) console.log('MARK', ((e.ts - t0) / 1000).toFixed(0), e.name)
await b.close()
