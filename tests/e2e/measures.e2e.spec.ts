import { afterAll, describe, expect, it } from 'vitest'
import { seriousViolations } from '../helpers/axe'
import { freshContext } from '../helpers/chromium'
import { startE2eServer } from '../helpers/e2eServer'

let server: Awaited<ReturnType<typeof startE2eServer>> | undefined
afterAll(async () => { await server?.close() })

describe('a PHQ-9 on the device, offline', () => {
  it('shows the crisis card at question 9 and before the score on the result, with the server stopped; the form and Measures pass axe', async () => {
    server = await startE2eServer()
    const base = server.url
    const { context, close } = await freshContext()
    const page = await context.newPage()
    await page.goto(base)
    await page.getByRole('heading', { name: 'A moment', exact: true }).waitFor()
    await page.evaluate(() => navigator.serviceWorker.ready.then(() => undefined))
    await page.reload()
    await page.waitForFunction(() => navigator.serviceWorker.controller !== null)
    // Offline for real: the server is gone as well as the network.
    await server.close()
    server = undefined
    await context.setOffline(true)

    await page.goto(`${base}/measures/new/phq9`)
    await page.locator('[data-test=measure-question]').waitFor()
    await page.waitForTimeout(300)
    const found = (await seriousViolations(page)).map((v) => `form: ${v}`)

    for (const a of [1, 2, 1, 1, 0, 1, 1, 0]) {
      await page.locator(`[data-test=measure-choice-${a}]`).click()
      await page.locator('[data-test=measure-next]').click()
    }
    await page.getByRole('heading', { name: 'Thoughts that you would be better off dead, or of hurting yourself in some way' }).waitFor()
    expect(await page.locator('[data-test=measure-selfharm-card]').count()).toBe(0)
    await page.locator('[data-test=measure-choice-1]').click()
    // At once, on the question itself, before moving on.
    await page.locator('[data-test=measure-selfharm-card]').waitFor({ state: 'visible' })
    expect(await page.locator('[data-test=measure-selfharm-card] [data-test=help-now]').isVisible()).toBe(true)
    found.push(...(await seriousViolations(page)).map((v) => `form with card: ${v}`))

    await page.locator('[data-test=measure-next]').click()
    await page.locator('[data-test=measure-choice-2]').click()
    await page.locator('[data-test=measure-finish]').click()
    await page.waitForURL((u) => /^\/measures\/[0-9a-f-]{36}$/.test(u.pathname))
    const card = page.locator('[data-test=measure-selfharm-card]')
    const score = page.locator('[data-test=measure-score]')
    await score.waitFor()
    expect(await card.isVisible()).toBe(true)
    expect(await page.locator('[data-test=measure-total]').textContent()).toBe('8') // 1+2+1+1+0+1+1+0, plus item 9 = 1
    // The card comes first in document order.
    const cardFirst = await page.evaluate(() => {
      const c = document.querySelector('[data-test=measure-selfharm-card]')!
      const s = document.querySelector('[data-test=measure-score]')!
      return Boolean(c.compareDocumentPosition(s) & Node.DOCUMENT_POSITION_FOLLOWING)
    })
    expect(cardFirst).toBe(true)

    await page.getByRole('tab', { name: 'Measures' }).click()
    await page.locator('[data-test=measure-history-phq9]').waitFor()
    await page.waitForTimeout(400)
    found.push(...(await seriousViolations(page)).map((v) => `Measures: ${v}`))
    expect(found).toEqual([])
    await close()
  })
})
