import fs from 'node:fs'
import type { Page } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { demoAccounts } from '../../server/db/seed'
import { freshContext } from '../helpers/chromium'
import { signInThroughForm, startE2eServer } from '../helpers/e2eServer'
import { signInOverFetch } from '../helpers/apiSession'

let server: Awaited<ReturnType<typeof startE2eServer>>
let linkId = ''
beforeAll(async () => {
  server = await startE2eServer()
  const person = await signInOverFetch(server.url, demoAccounts.person)
  const links = (await person('GET', '/api/person/links')).body.links as { id: string; state: string }[]
  linkId = links.find((l) => l.state === 'active')!.id
  fs.mkdirSync('.screens', { recursive: true })
})
afterAll(async () => { await server?.close() })

/** Every CSP violation the page reports, and any console line about one, from before the first script runs. */
async function recordViolations(page: Page): Promise<() => Promise<string[]>> {
  const consoleLines: string[] = []
  page.on('console', (m) => { if (/Content Security Policy/i.test(m.text())) consoleLines.push(m.text()) })
  await page.addInitScript(() => {
    const seen: string[] = []
    ;(window as unknown as { __cspViolations: string[] }).__cspViolations = seen
    document.addEventListener('securitypolicyviolation', (e) => seen.push(`${e.violatedDirective} ${e.blockedURI} ${e.sourceFile}:${e.lineNumber}`))
  })
  return async () => [...(await page.evaluate(() => (window as unknown as { __cspViolations: string[] }).__cspViolations)), ...consoleLines]
}

describe('the strict CSP holds in the real app', () => {
  it('the person\'s Today page and the Summary page (with the PDF made) report no CSP violation', async () => {
    const { context, close } = await freshContext({ width: 390, height: 844 })
    const page = await context.newPage()
    const violations = await recordViolations(page)
    await signInThroughForm(page, server.url, demoAccounts.person.email, demoAccounts.person.password)
    await page.getByRole('heading', { name: 'A moment', exact: true }).waitFor()
    expect(await violations()).toEqual([])
    await page.screenshot({ path: '.screens/csp-today-390.png' })

    await page.goto(`${server.url}/more/summary`)
    await page.getByRole('heading', { name: 'Summary for an appointment' }).waitFor()
    const downloading = page.waitForEvent('download')
    await page.getByRole('button', { name: 'Make the PDF' }).click()
    const download = await downloading
    expect(download.suggestedFilename()).toMatch(/^rungs-summary-\d{4}-\d{2}-\d{2}\.pdf$/)
    expect(await violations()).toEqual([])
    await page.screenshot({ path: '.screens/csp-summary-390.png' })
    await close()
  })

  it('a therapist\'s prep page reports no CSP violation', async () => {
    const { context, close } = await freshContext({ width: 1280, height: 800 })
    const page = await context.newPage()
    const violations = await recordViolations(page)
    await signInThroughForm(page, server.url, demoAccounts.therapist.email, demoAccounts.therapist.password)
    await page.goto(`${server.url}/therapist/prep/${linkId}`)
    await page.locator('[data-test=prep-name]').waitFor()
    expect(await page.locator('[data-test=prep-name]').textContent()).toBe(demoAccounts.person.displayName)
    expect(await violations()).toEqual([])
    await page.screenshot({ path: '.screens/csp-prep-1280.png' })
    await close()
  })

  it('the recorder does see a violation when one happens', async () => {
    const { context, close } = await freshContext({ width: 390, height: 844 })
    const page = await context.newPage()
    const violations = await recordViolations(page)
    await page.goto(server.url)
    await page.getByRole('heading', { name: 'A moment', exact: true }).waitFor()
    // An inline script added by the page itself must be blocked by the policy and reported.
    await page.evaluate(() => {
      const s = document.createElement('script')
      s.textContent = 'window.__ran = true'
      document.body.append(s)
    })
    await page.waitForFunction(() => (window as unknown as { __cspViolations: string[] }).__cspViolations.length > 0)
    expect((await violations()).join('\n')).toContain('script-src')
    expect(await page.evaluate(() => (window as unknown as { __ran?: boolean }).__ran)).toBeUndefined()
    await close()
  })
})
