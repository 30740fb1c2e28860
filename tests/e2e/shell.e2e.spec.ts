import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { demoAccounts } from '../../server/db/seed'
import { freshContext } from '../helpers/chromium'
import { signInThroughForm, startE2eServer } from '../helpers/e2eServer'

let server: Awaited<ReturnType<typeof startE2eServer>>
beforeAll(async () => { server = await startE2eServer() })
afterAll(async () => { await server?.close() })

async function expectHelpNowOpens(page: import('playwright-core').Page, path: string) {
  const button = page.getByRole('button', { name: 'Help now' })
  // The static fallback's heading can show before the app mounts; wait for the app's own button.
  await button.waitFor({ state: 'visible', timeout: 10_000 }).catch(() => {})
  await expect(button.isVisible(), `Help now visible on ${path}`).resolves.toBe(true)
  await button.click()
  const dialog = page.getByRole('dialog')
  await dialog.getByRole('heading', { name: 'Help now' }).waitFor()
  // en-GB locale: the UK emergency number shows before any choice is made.
  expect(await dialog.locator('[data-test=emergency-call]').getAttribute('href'), path).toBe('tel:999')
  expect(await dialog.textContent()).toContain('Nobody watches Rungs in real time')
  await dialog.getByRole('button', { name: 'Close Help now' }).click()
  await dialog.waitFor({ state: 'hidden' })
}

describe('the app shell in Chromium', () => {
  it('loads the person side without an account', async () => {
    const { context, close } = await freshContext()
    const page = await context.newPage()
    await page.goto(server.url)
    // The app's own screen, not index.html's prerendered copy of it.
    await page.locator('#app > .q-layout').getByRole('heading', { name: 'A moment', exact: true }).waitFor()
    expect(await page.title()).toBe('Today · Rungs')
    await close()
  })

  it('shows Help now and opens it on every route, signed out and signed in', async () => {
    const { context, close } = await freshContext()
    const page = await context.newPage()
    for (const path of ['/', '/more', '/more/settings', '/signin', '/signup', '/forgot', '/reset?token=x', '/verify?token=x', '/no-such-page']) {
      await page.goto(server.url + path)
      await page.locator('h1').first().waitFor()
      await expectHelpNowOpens(page, path)
    }
    await signInThroughForm(page, server.url, demoAccounts.therapist.email, demoAccounts.therapist.password)
    await page.goto(server.url + '/therapist/settings')
    await page.getByRole('heading', { name: 'Settings' }).waitFor()
    await expectHelpNowOpens(page, '/therapist/settings')
    await close()

    const admin = await freshContext({ width: 1280, height: 800 })
    const adminPage = await admin.context.newPage()
    await signInThroughForm(adminPage, server.url, demoAccounts.admin.email, demoAccounts.admin.password)
    for (const path of ['/admin/approvals', '/admin/accounts', '/admin/mail']) {
      await adminPage.goto(server.url + path)
      await adminPage.locator('h1').first().waitFor()
      await expectHelpNowOpens(adminPage, path)
    }
    await admin.close()
  })

  it('lets the person choose another region and remembers it on the device', async () => {
    const { context, close } = await freshContext()
    const page = await context.newPage()
    await page.goto(server.url)
    await page.getByRole('button', { name: 'Help now' }).click()
    await page.getByLabel('Where are you?').click()
    await page.getByRole('option', { name: 'Australia' }).click()
    expect(await page.locator('[data-test=emergency-call]').getAttribute('href')).toBe('tel:000')
    expect(await page.locator('a[href="tel:131114"]').count()).toBeGreaterThan(0)
    expect(await page.locator('a[href="sms:0477131114"]').count()).toBe(1)
    await page.reload()
    await page.getByRole('button', { name: 'Help now' }).click()
    expect(await page.locator('[data-test=emergency-call]').getAttribute('href')).toBe('tel:000')
    await close()
  })

  it('guesses the region from the browser locale on first launch', async () => {
    const { context, close } = await freshContext({ locale: 'en-US' })
    const page = await context.newPage()
    await page.goto(server.url)
    await page.getByRole('button', { name: 'Help now' }).click()
    expect(await page.locator('[data-test=emergency-call]').getAttribute('href')).toBe('tel:911')
    expect(await page.locator('a[href="tel:988"]').count()).toBeGreaterThan(0)
    await close()
  })

  it('still shows emergency numbers from index.html when the app script cannot load', async () => {
    const { context, close } = await freshContext()
    const page = await context.newPage()
    await page.route('**/assets/*.js', (route) => route.abort())
    await page.goto(server.url)
    // Shown at once over the prerendered Today (public/first-paint.js sees the script fail), not after its 8 s wait.
    await page.locator('.static-fallback').waitFor({ state: 'visible', timeout: 2_000 })
    const text = await page.locator('#app').textContent()
    expect(text).toContain('call your local emergency number')
    expect(await page.locator('a[href="tel:999"]').count()).toBeGreaterThan(0)
    expect(await page.locator('a[href="tel:988"]').count()).toBeGreaterThan(0)
    await close()
  })

  it('sends a signed-out visitor of a therapist page to sign in', async () => {
    const { context, close } = await freshContext()
    const page = await context.newPage()
    await page.goto(server.url + '/therapist/settings')
    await page.waitForURL((u) => u.pathname === '/signin')
    expect(new URL(page.url()).searchParams.get('redirect')).toBe('/therapist/settings')
    await close()
  })
})
