import { freshContext } from './helpers/chromium'
const origin = 'http://127.0.0.1:4410'
const OBS = `
window.__log = [];
const t0 = performance.now();
new PerformanceObserver((l) => { for (const e of l.getEntries()) window.__log.push(['lcp', Math.round(e.startTime), e.size, e.element && e.element.closest('.first-screen') ? 'pre' : 'app']) }).observe({ type: 'largest-contentful-paint', buffered: true });
new PerformanceObserver((l) => { for (const e of l.getEntries()) window.__log.push([e.name, Math.round(e.startTime)]) }).observe({ type: 'paint', buffered: true });
const tick = () => { const p = document.querySelector('.first-screen .first-run p.reading'); const r = p && p.getBoundingClientRect(); window.__log.push(['raf', Math.round(performance.now()), r ? Math.round(r.width*r.height) : -1, document.visibilityState, document.fonts ? document.fonts.status : '']); if (performance.now() < 2500) requestAnimationFrame(tick) };
requestAnimationFrame(tick);
`
async function throttle(context: any, page: any) { const cdp = await context.newCDPSession(page); await cdp.send('Network.enable'); await cdp.send('Network.emulateNetworkConditions', { offline: false, latency: 150, downloadThroughput: (1.6 * 1024 * 1024) / 8, uploadThroughput: (750 * 1024) / 8 }); await cdp.send('Emulation.setCPUThrottlingRate', { rate: 4 }) }
const out: string[] = []
for (let i = 0; i < 3; i++) {
  const b = await freshContext()
  await b.context.addInitScript(OBS)
  const page = await b.context.newPage(); await throttle(b.context, page)
  await page.goto(origin + '/', { waitUntil: 'load' }); await page.waitForTimeout(3000)
  await page.evaluate(async () => { await navigator.serviceWorker.ready })
  const warm = await b.context.newPage(); await throttle(b.context, warm); await page.close()
  await warm.goto(origin + '/', { waitUntil: 'load' }); await warm.waitForTimeout(2500)
  const log = await warm.evaluate('window.__log') as any[]
  const nav = await warm.evaluate(`(() => { const n = performance.getEntriesByType('navigation')[0]; const r = performance.getEntriesByType('resource').filter(e => /css|first-paint|woff/.test(e.name)).map(e => [e.name.split('/').pop().slice(0, 24), Math.round(e.startTime), Math.round(e.workerStart), Math.round(e.responseStart), Math.round(e.responseEnd)]); return { workerStart: Math.round(n.workerStart), fetchStart: Math.round(n.fetchStart), reqStart: Math.round(n.requestStart), respStart: Math.round(n.responseStart), respEnd: Math.round(n.responseEnd), domInteractive: Math.round(n.domInteractive), r } })()`)
  out.push(log.filter((x) => x[0] === 'lcp' || x[0] === 'first-contentful-paint').map((x) => x[0].slice(0, 3) + ' ' + x[1] + (x[3] ? ' ' + x[3] : '')).join(' / '))
  await b.close()
}
console.log(process.env.VARIANT, out.join('  |  '))
