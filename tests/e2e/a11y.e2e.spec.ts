import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { demoAccounts } from '../../server/db/seed'
import { freshContext } from '../helpers/chromium'
import { signInThroughForm, startE2eServer } from '../helpers/e2eServer'
import { seriousViolations } from '../helpers/axe'

let server: Awaited<ReturnType<typeof startE2eServer>>
beforeAll(async () => { server = await startE2eServer() })
afterAll(async () => { await server?.close() })

const personScreens = ['/', '/journal', '/patterns', '/tug', '/grounding', '/more', '/more/settings', '/more/backup', '/signin', '/signup', '/forgot', '/no-such-page']

describe.each(['light', 'dark'] as const)('accessibility in %s mode (axe-core)', (colorScheme) => {
  it('finds no serious or critical violations on the person and sign-in screens, or in Help now', async () => {
    const { context, close } = await freshContext({ colorScheme })
    const page = await context.newPage()
    const found: string[] = []
    for (const path of personScreens) {
      await page.goto(server.url + path)
      await page.locator('h1').first().waitFor()
      await page.waitForTimeout(300)
      found.push(...(await seriousViolations(page)).map((v) => `${path}: ${v}`))
    }
    await page.goto(server.url)
    await page.getByRole('button', { name: 'Help now' }).click()
    await page.getByRole('dialog').getByRole('heading', { name: 'Help now' }).waitFor()
    await page.waitForTimeout(400)
    found.push(...(await seriousViolations(page)).map((v) => `Help now: ${v}`))
    expect(found).toEqual([])
    await close()
  })

  it('finds no serious or critical violations on the therapist and admin screens', async () => {
    const { context, close } = await freshContext({ colorScheme, width: 1280, height: 800 })
    const page = await context.newPage()
    const found: string[] = []
    await signInThroughForm(page, server.url, demoAccounts.therapist.email, demoAccounts.therapist.password)
    await page.goto(server.url + '/therapist/settings')
    await page.locator('[data-test=approval-badge]').waitFor()
    found.push(...(await seriousViolations(page)).map((v) => `therapist: ${v}`))
    await page.getByRole('button', { name: 'Sign out', exact: true }).click()
    await page.waitForURL((u) => u.pathname === '/signin')
    await signInThroughForm(page, server.url, demoAccounts.admin.email, demoAccounts.admin.password)
    for (const path of ['/admin/approvals', '/admin/accounts', '/admin/mail']) {
      await page.goto(server.url + path)
      await page.locator('h1').first().waitFor()
      await page.waitForTimeout(500)
      found.push(...(await seriousViolations(page)).map((v) => `${path}: ${v}`))
    }
    expect(found).toEqual([])
    await close()
  })
})
