import fs from 'node:fs'
import path from 'node:path'
import type { Page } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { freshContext } from '../helpers/chromium'
import { startE2eServer } from '../helpers/e2eServer'

// index.html holds Today rendered at build time; the app's code is held back here to look at that screen on its own.
let server: Awaited<ReturnType<typeof startE2eServer>>
beforeAll(async () => { server = await startE2eServer() })
afterAll(async () => { await server?.close() })

/** Opens `path` with the app's entry script held until `release()`: what shows is index.html alone. */
async function openHeld(page: Page, path = '/'): Promise<() => Promise<void>> {
  let release!: () => void
  const gate = new Promise<void>((r) => (release = r))
  await page.route('**/assets/index-*.js', async (route) => {
    await gate
    await route.continue()
  })
  await page.goto(server.url + path, { waitUntil: 'commit' })
  await page.locator('#app').waitFor({ state: 'attached' })
  await page.waitForLoadState('domcontentloaded', { timeout: 1_000 }).catch(() => undefined)
  return async () => {
    release()
    await page.locator('#app > .q-layout').waitFor()
  }
}

/** The faces DESIGN.md names: Lora for headings and entry text, the system UI font for controls. */
async function faces(page: Page): Promise<string[]> {
  const face = (s: string) => page.locator(s).first().evaluate((el) => getComputedStyle(el).fontFamily)
  return [await face('#moment-title'), await face('[data-test=help-now]'), await face('[data-test=moment-body]')]
}
// A heading, Help now (a control), the moment's text. Short stacks: each family the device lacks is one more lookup in
// the first layout (client/css/app.css).
const FACES = ['Lora, serif', 'system-ui, sans-serif', 'Lora, serif']

const BOXES = ['#moment-title', '[data-test=moment-body]', '#tug-title', '[data-test=help-now]', '#first-run-title']
async function boxes(page: Page): Promise<Record<string, number[]>> {
  const out: Record<string, number[]> = {}
  for (const s of BOXES) {
    const b = await page.locator(s).boundingBox()
    out[s] = b ? [b.x, b.y, b.width, b.height].map(Math.round) : []
  }
  return out
}

/**
 * Every computed property of every element on the page, and of its ::before and ::after where they have content, one
 * string each ("3 div.q-page|color: rgb(…)").
 */
function computedStyles(): string[] {
  const out: string[] = []
  document.querySelectorAll('body, body *').forEach((el, i) => {
    const name = `${i} ${el.tagName.toLowerCase()}.${[...el.classList].join('.')}`
    for (const pseudo of [null, '::before', '::after']) {
      const cs = getComputedStyle(el, pseudo)
      if (pseudo && cs.content === 'none') continue
      for (let k = 0; k < cs.length; k++) out.push(`${name}${pseudo ?? ''}|${cs[k]}: ${cs.getPropertyValue(cs[k]!)}`)
    }
  })
  return out
}

// The whole stylesheet the app's chunk loads (client/startApp.ts); index.html links only the first screen's rules.
const wholeSheets = () => fs.readdirSync(path.resolve('dist/assets')).filter((f) => /^startApp-.*\.css$/.test(f))

describe("index.html's prerendered Today in Chromium", () => {
  for (const [width, height] of [[390, 844], [1280, 800]] as const) {
    it(`paints before the app's code has run, laid out as the app then lays it out (${width} px)`, async () => {
      const { context, close } = await freshContext({ width, height })
      const page = await context.newPage()
      const release = await openHeld(page)
      await page.locator('.first-screen #moment-title').waitFor()
      expect(await page.locator('.static-fallback').isVisible()).toBe(false)
      expect(await page.locator('.first-screen .q-footer').isVisible()).toBe(width < 1024)
      expect(await page.locator('.first-screen .q-drawer').isVisible()).toBe(width >= 1024)
      const before = await boxes(page)
      expect(await faces(page)).toEqual(FACES)
      await release()
      await page.locator('#app > .q-layout #moment-title').waitFor()
      expect(await page.locator('.first-screen').count()).toBe(0)
      expect(await faces(page)).toEqual(FACES)
      const after = await boxes(page)
      for (const s of BOXES) {
        expect(before[s]!.length, s).toBe(4)
        // Within a pixel: the app's textarea may grow by one as it measures itself.
        before[s]!.forEach((v, i) => expect(Math.abs(v - after[s]![i]!), `${s} [${i}] ${before[s]} → ${after[s]}`).toBeLessThanOrEqual(1))
      }
      await close()
    })
  }

  for (const [label, width, colorScheme] of [['phone, light', 390, 'light'], ['wide, dark', 1280, 'dark']] as const) {
    it(`is styled by its own rules exactly as by the whole stylesheet, which is not render-blocking (${label})`, async () => {
      const html = await (await fetch(server.url + '/')).text()
      const head = html.slice(0, html.indexOf('</head>'))
      const linked = [...head.matchAll(/<link rel="stylesheet" href="([^"]+)"/g)].map((m) => m[1])
      expect(linked).toHaveLength(2)
      expect(linked[0]).toBe('/first-paint.css')
      expect(linked[1]).toMatch(/^\/assets\/first-screen-[\w-]+\.css$/)
      expect(wholeSheets()).toHaveLength(1)
      const { context, close } = await freshContext({ width, height: 844, colorScheme })
      const page = await context.newPage()
      await openHeld(page)
      await page.locator('.first-screen #moment-title').waitFor()
      // Held still: reading every style takes seconds, and the Help now block's 8 s reveal must not count as a change.
      await page.evaluate(() => document.getAnimations().forEach((a) => a.pause()))
      const own = await page.evaluate(computedStyles)
      await page.evaluate(async (href) => {
        const link = Object.assign(document.createElement('link'), { rel: 'stylesheet', href })
        await new Promise((resolve, reject) => {
          link.onload = resolve
          link.onerror = reject
          document.head.append(link)
        })
      }, `/assets/${wholeSheets()[0]}`)
      const whole = await page.evaluate(computedStyles)
      expect(own.length).toBeGreaterThan(50_000)
      const before = new Set(own)
      expect(whole.filter((s) => !before.has(s)).slice(0, 10)).toEqual([])
      expect(whole.length).toBe(own.length)
      await close()
    })
  }

  it('holds its first paint until the whole screen is parsed, so it never shows the header alone', async () => {
    const html = await (await fetch(server.url + '/')).text()
    const head = html.slice(0, html.indexOf('</head>'))
    expect(head).toMatch(/<link rel="expect" href="#fallback-title" blocking="render"/)
    // The element waited for comes after all of Today, in every layout.
    const at = html.indexOf('id="fallback-title"')
    for (const part of ['data-test="tug-start"', 'q-footer', 'q-drawer', 'data-test="help-now"']) expect(html.indexOf(part), part).toBeGreaterThan(0)
    for (const part of ['data-test="tug-start"', 'q-footer', 'q-drawer']) expect(html.lastIndexOf(part), part).toBeLessThan(at)
  })

  it('carries what was typed before the app started into the app form, where it is kept as a draft', async () => {
    const { context, close } = await freshContext()
    const page = await context.newPage()
    const release = await openHeld(page)
    const early = page.locator('.first-screen [data-test=moment-body]')
    await early.click()
    await page.keyboard.type('The bus was late and I snapped at Dee')
    await release()
    const field = page.locator('#app > .q-layout [data-test=moment-body]')
    await expect.poll(() => field.inputValue()).toBe('The bus was late and I snapped at Dee')
    expect(await field.evaluate((el) => el === document.activeElement)).toBe(true)
    await page.keyboard.type('.')
    await page.waitForTimeout(1_500)
    await page.reload()
    await expect.poll(() => page.locator('#app > .q-layout [data-test=moment-body]').inputValue(), { timeout: 10_000 }).toBe('The bus was late and I snapped at Dee.')
    await close()
  })

  it("shows the emergency numbers at once when Help now is tapped before the app started, then the app's Help now", async () => {
    const { context, close } = await freshContext()
    const page = await context.newPage()
    const release = await openHeld(page)
    await page.locator('.first-screen [data-test=help-now]').click()
    await page.locator('.static-fallback').waitFor({ state: 'visible', timeout: 1_000 })
    expect(await page.locator('.static-fallback a[href="tel:999"]').first().isVisible()).toBe(true)
    await release()
    const dialog = page.getByRole('dialog')
    await dialog.getByRole('heading', { name: 'Help now' }).waitFor()
    expect(await dialog.locator('[data-test=emergency-call]').getAttribute('href')).toBe('tel:999')
    await close()
  })

  it('is not shown at another address, nor when a lock is set: the plain loading block is', async () => {
    const { context, close } = await freshContext()
    const page = await context.newPage()
    await openHeld(page, '/journal')
    await page.locator('.static-fallback').waitFor({ state: 'visible', timeout: 2_000 })
    expect(await page.locator('.first-screen').isVisible()).toBe(false)
    await close()
    // A profile of its own, with no service worker from an earlier page: page.route does not see what a service worker
    // serves, so the held script would run at once.
    const second = await freshContext()
    await second.context.addInitScript(() => localStorage.setItem('rungs.lockSet', 'yes'))
    const locked = await second.context.newPage()
    await openHeld(locked)
    await locked.locator('.static-fallback').waitFor({ state: 'visible', timeout: 2_000 })
    expect(await locked.locator('.first-screen').isVisible()).toBe(false)
    await second.close()
  })

  it('leaves out the first-run notice once it was acknowledged, and paints dark on a dark device', async () => {
    const { context, close } = await freshContext({ colorScheme: 'dark' })
    await context.addInitScript(() => localStorage.setItem('rungs.firstRunSeen', 'yes'))
    const page = await context.newPage()
    await openHeld(page)
    await page.locator('.first-screen #moment-title').waitFor()
    expect(await page.locator('.first-screen [data-test=first-run]').isVisible()).toBe(false)
    expect(await page.evaluate(() => document.body.classList.contains('body--dark'))).toBe(true)
    await close()
  })
})
