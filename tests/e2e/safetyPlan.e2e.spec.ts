import { afterAll, describe, expect, it } from 'vitest'
import { seriousViolations } from '../helpers/axe'
import { freshContext } from '../helpers/chromium'
import { startE2eServer } from '../helpers/e2eServer'

let server: Awaited<ReturnType<typeof startE2eServer>> | undefined
afterAll(async () => { await server?.close() })

describe('the safety plan from Help now', () => {
  it('opens in one tap from Help now, signed out and offline, with numbers to tap and no serious axe violations', async () => {
    server = await startE2eServer()
    const { context, close } = await freshContext()
    const page = await context.newPage()

    // Signed out from start to end: make a plan.
    await page.goto(`${server.url}/more/safety-plan`)
    await page.getByRole('heading', { name: 'My safety plan' }).waitFor()
    await page.getByRole('button', { name: 'Make my plan' }).click()
    await page.locator('[data-test=plan-contacts-askForHelp] [data-test=plan-contact-add]').click()
    await page.locator('[data-test=plan-contacts-askForHelp] input[data-test=plan-contact-name]').fill('Marguerite')
    await page.locator('[data-test=plan-contacts-askForHelp] input[data-test=plan-contact-phone]').fill('07700 900789')
    await page.getByRole('textbox', { name: 'My reason to keep going' }).fill('The garden in June')
    expect(await seriousViolations(page), 'the edit view').toEqual([])
    await page.getByRole('button', { name: 'Save my plan' }).click()
    await page.locator('[data-test=plan-read]').waitFor()

    await page.evaluate(() => navigator.serviceWorker.ready.then(() => undefined))
    await page.reload()
    await page.waitForFunction(() => navigator.serviceWorker.controller !== null)
    await server.close()
    server = undefined
    await context.setOffline(true)

    await page.goto(new URL('/', page.url()).href)
    await page.getByRole('heading', { name: 'A moment', exact: true }).waitFor()
    await page.getByRole('button', { name: 'Help now' }).click()
    await page.getByRole('dialog').getByRole('link', { name: 'My safety plan' }).click()

    const plan = page.locator('[data-test=plan-read]')
    await plan.waitFor()
    expect(new URL(page.url()).pathname).toBe('/more/safety-plan')
    expect(await plan.textContent()).toContain('The garden in June')
    expect(await plan.getByRole('link', { name: 'Call Marguerite on 07700 900789' }).getAttribute('href')).toBe('tel:07700900789')
    // The region's lines came with the fresh plan: en-GB guesses the UK. REFERENCE §5: UK 999, Samaritans 116 123 [C]
    expect(await plan.locator('a[href="tel:999"]').count()).toBe(1)
    expect(await plan.locator('a[href="tel:116123"]').count()).toBe(1)
    // Help now closes on the way, so the plan is not hidden behind it.
    await page.getByRole('dialog').waitFor({ state: 'detached', timeout: 5000 })

    expect(await seriousViolations(page)).toEqual([])
    await close()
  })
})
