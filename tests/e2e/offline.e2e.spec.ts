import { afterAll, describe, expect, it } from 'vitest'
import { freshContext } from '../helpers/chromium'
import { startE2eServer } from '../helpers/e2eServer'

let server: Awaited<ReturnType<typeof startE2eServer>> | undefined
afterAll(async () => { await server?.close() })

describe('offline after one visit', () => {
  it('renders the app and Help now from the service worker with the network off and the server stopped', async () => {
    server = await startE2eServer()
    const { context, close } = await freshContext()
    const page = await context.newPage()
    await page.goto(server.url)
    await page.getByRole('heading', { name: 'A moment', exact: true }).waitFor()
    await page.evaluate(() => navigator.serviceWorker.ready.then(() => undefined))
    // A first visit installs the worker; it controls the page from the next load.
    await page.reload()
    await page.waitForFunction(() => navigator.serviceWorker.controller !== null)
    await server.close()
    server = undefined
    await context.setOffline(true)

    await page.reload()
    await page.getByRole('heading', { name: 'A moment', exact: true }).waitFor()
    await page.getByRole('tab', { name: 'More' }).click()
    await page.getByRole('heading', { name: 'More' }).waitFor()
    await page.getByRole('button', { name: 'Help now' }).click()
    expect(await page.locator('[data-test=emergency-call]').getAttribute('href')).toBe('tel:999')
    // The fonts come from the precache too.
    const fonts = await page.evaluate(async () => {
      await document.fonts.ready
      return { lora: document.fonts.check('16px Lora'), icons: document.fonts.check('24px "Material Icons"') }
    })
    expect(fonts).toEqual({ lora: true, icons: true })
    await close()
  })
})
