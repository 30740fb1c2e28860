import { freshContext } from './helpers/chromium'
const url = 'http://127.0.0.1:4410/'
for (const [w, h] of [[390, 844], [1280, 800]]) {
  const { context, close } = await freshContext({ width: w, height: h })
  const page = await context.newPage()
  let release!: () => void
  const gate = new Promise<void>((r) => (release = r))
  await page.route('**/assets/index-*.js', async (route) => { await gate; await route.continue() })
  await page.goto(url, { waitUntil: 'commit' })
  await page.waitForSelector('.first-screen', { state: 'attached' }); await page.waitForTimeout(1500)
  await page.screenshot({ path: `/tmp/pre-${w}.png` })
  const pre = await page.evaluate(`(() => { const r = (s) => { const e = [...document.querySelectorAll(s)].find((x) => x.getClientRects().length); const b = e && e.getBoundingClientRect(); return b ? [b.x, b.y, b.width, b.height].map(Math.round) : null }; return { h1: r('#moment-title'), ta: r('textarea'), tug: r('#tug-title'), help: r('[data-test=help-now]'), first: r('#first-run-title') } })()`)
  release()
  await page.waitForSelector('#app > .q-layout')
  await page.waitForTimeout(1500)
  await page.screenshot({ path: `/tmp/post-${w}.png` })
  const post = await page.evaluate(`(() => { const r = (s) => { const e = [...document.querySelectorAll(s)].find((x) => x.getClientRects().length); const b = e && e.getBoundingClientRect(); return b ? [b.x, b.y, b.width, b.height].map(Math.round) : null }; return { h1: r('#moment-title'), ta: r('textarea'), tug: r('#tug-title'), help: r('[data-test=help-now]'), first: r('#first-run-title') } })()`)
  console.log(w, JSON.stringify(pre), JSON.stringify(post))
  await close()
}
