import fs from 'node:fs'
import type { BrowserContext, Page } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { demoAccounts } from '../../server/db/seed'
import { freshContext } from '../helpers/chromium'
import { signInThroughForm, startE2eServer } from '../helpers/e2eServer'
import { saveMoment } from '../helpers/journalFlows'
import { seriousViolations } from '../helpers/axe'

/** Every http(s) request a context makes, the service worker's included. */
function recordUrls(context: BrowserContext): string[] {
  const seen: string[] = []
  context.on('request', (r) => seen.push(r.url()))
  return seen
}

/** Opens an entry from the journal by words in it; returns its id. */
async function openEntry(page: Page, origin: string, words: string): Promise<string> {
  await page.goto(origin + '/journal')
  await page.locator('[data-test=entry-card]').filter({ hasText: words }).first().click()
  await page.waitForURL((u) => u.pathname.startsWith('/journal/'))
  return new URL(page.url()).pathname.split('/').pop()!
}

const first = 'Heavy morning, the kettle sounded far too loud'
const firstEdited = 'Heavy morning, but a slow walk round the block settled me'
const second = 'Told my brother no about Sunday and did not apologise'

let server: Awaited<ReturnType<typeof startE2eServer>>
beforeAll(async () => {
  server = await startE2eServer()
  fs.mkdirSync('.screens', { recursive: true })
})
afterAll(async () => { await server?.close() })

describe('sharing seen from both sides, in two Chromium profiles', () => {
  it('queues two shares and an edit offline, sends them when online, the therapist reads the latest text, and a withdrawal reaches them', async () => {
    const origin = new URL(server.url).origin
    const person = await freshContext({ width: 390, height: 844 })
    const therapist = await freshContext({ width: 1280, height: 800 })
    const urls = recordUrls(person.context)
    const therapistUrls = recordUrls(therapist.context)
    try {
      const page = await person.context.newPage()
      await signInThroughForm(page, server.url, demoAccounts.person.email, demoAccounts.person.password)
      // Installed, so the app keeps working with the network off.
      await page.evaluate(() => navigator.serviceWorker.ready.then(() => undefined))
      await page.reload()
      await page.waitForFunction(() => navigator.serviceWorker.controller !== null)
      // Signing in told the device about the link: the journal offers to select entries for sharing.
      await page.goto(origin + '/journal')
      await page.locator('[data-test=journal-select]').waitFor()

      await person.context.setOffline(true)
      await page.goto(origin + '/')
      await saveMoment(page, first)
      await page.goto(origin + '/')
      await saveMoment(page, second)

      // The second one is shared from its own page.
      const secondId = await openEntry(page, origin, second)
      await page.locator('[data-test=entry-share-open]').click()
      await page.locator('[data-test=share-preview]').waitFor()
      await page.locator('[data-test=share-confirm]').click()
      await page.locator('[data-test=share-state-queued]').waitFor()

      // Both are ticked in the journal; the one already shared is named as such and skipped.
      await page.goto(origin + '/journal')
      await page.locator('[data-test=journal-select]').click()
      const boxes = page.locator('[data-test=journal-select-box]')
      await boxes.nth(1).waitFor()
      expect(await boxes.count()).toBe(2)
      for (const state of await boxes.evaluateAll((els) => els.map((e) => e.getAttribute('aria-checked')))) expect(state).toBe('false')
      expect(await page.locator('[data-test=journal-share-these]').isDisabled()).toBe(true)
      const firstBox = page.getByRole('checkbox', { name: new RegExp(`^Moment, .*: ${first.slice(0, 20)}`) })
      await firstBox.click()
      // Tapping the card itself ticks too, and never opens the entry while choosing.
      await page.locator('[data-test=journal-select-row]').filter({ hasText: second }).locator('[data-test=entry-card]').click({ force: true })
      expect(new URL(page.url()).pathname).toBe('/journal')
      expect(await page.locator('[data-test=journal-selected-count]').textContent()).toBe('2 selected')
      const box = await page.locator('[data-test=journal-select-box]').first().boundingBox()
      expect(Math.min(box!.width, box!.height)).toBeGreaterThanOrEqual(44)
      await page.screenshot({ path: '.screens/journal-select-390.png' })
      await page.setViewportSize({ width: 1280, height: 800 })
      await page.screenshot({ path: '.screens/journal-select-1280.png' })
      await page.setViewportSize({ width: 390, height: 844 })

      await page.locator('[data-test=journal-share-these]').click()
      const preview = page.locator('[data-test=share-these-preview]')
      await preview.waitFor()
      expect(await preview.locator('h2').textContent()).toBe(`Share 1 entry with ${demoAccounts.therapist.displayName}?`)
      const sending = preview.locator('[data-test=share-these-entry]')
      expect(await sending.count()).toBe(1)
      expect(await sending.textContent()).toContain(first)
      const skipped = preview.locator('[data-test=share-these-entry-skipped]')
      expect(await skipped.textContent()).toContain('Already shared')
      expect(await skipped.textContent()).toContain(second.slice(0, 20))
      expect(await preview.locator('[data-test=share-these-risk-flag]').count()).toBe(0)
      expect(await preview.locator('[data-test=share-caution]').textContent()).toContain('not watching Rungs in real time')
      expect(await seriousViolations(page)).toEqual([])
      await page.screenshot({ path: '.screens/journal-share-these-390.png' })
      await page.setViewportSize({ width: 1280, height: 800 })
      await page.screenshot({ path: '.screens/journal-share-these-1280.png' })
      expect(await seriousViolations(page)).toEqual([])
      await page.setViewportSize({ width: 390, height: 844 })
      await preview.locator('[data-test=share-these-confirm]').click()
      await page.getByText(`1 entry waiting to send to ${demoAccounts.therapist.displayName}`).first().waitFor()
      expect(await page.locator('[data-test=journal-select-bar]').count()).toBe(0)
      expect(await page.locator('[data-test=journal-select-box]').count()).toBe(0)

      // An edit to a shared entry, still offline: the copy waits to follow it.
      const firstId = await openEntry(page, origin, first)
      await page.locator('[data-test=share-state-queued]').waitFor()
      await page.locator('[data-test=entry-edit]').click()
      await page.locator('textarea[data-test=moment-body]').fill(firstEdited)
      await page.locator('[data-test=moment-save]').click()
      await page.getByText('Moment updated.').first().waitFor()
      expect(await page.locator('[data-test=entry-body]').textContent()).toBe(firstEdited)
      expect(await page.locator('[data-test=entry-share]').textContent()).toContain('Waiting to send')
      await page.goto(`${origin}/journal/${secondId}`)
      // The page loads the entry from IndexedDB after navigation: wait for it rather than look at once.
      await page.locator('[data-test=entry-share]').getByText('Waiting to send').waitFor()

      // Back online, the outbox drains.
      await person.context.setOffline(false)
      await page.locator('[data-test=share-state-shared]').waitFor({ timeout: 15_000 })
      await page.goto(`${origin}/journal/${firstId}`)
      await page.locator('[data-test=share-state-shared]').waitFor({ timeout: 15_000 })

      // The therapist, in their own profile, finds both, with the edited words only.
      const tpage = await therapist.context.newPage()
      await signInThroughForm(tpage, server.url, demoAccounts.therapist.email, demoAccounts.therapist.password)
      const row = tpage.locator('[data-test=caseload-table] tbody tr').filter({ hasText: demoAccounts.person.displayName })
      await row.waitFor()
      await row.locator('td').nth(3).click()
      await tpage.waitForURL((u) => u.pathname.startsWith('/therapist/prep/'))
      const prepEntries = tpage.locator('[data-test=prep-entry]')
      await prepEntries.filter({ hasText: firstEdited }).waitFor()
      expect(await prepEntries.filter({ hasText: second }).count()).toBe(1)
      expect(await prepEntries.filter({ hasText: firstEdited }).count()).toBe(1)
      expect(await tpage.locator('main, body').first().textContent()).not.toContain('kettle sounded')

      // The person sees that the therapist opened them.
      await page.goto(origin + '/more/share')
      const card = page.locator('[data-test^="link-"]').filter({ hasText: demoAccounts.therapist.displayName }).first()
      await card.getByText('Who opened what').click()
      const log = card.locator('[data-test=link-access-log] li')
      await log.nth(1).waitFor()
      const lines = await log.allTextContents()
      expect(lines.filter((l) => l.includes(`${demoAccounts.therapist.displayName} opened Moment of`)).length).toBeGreaterThanOrEqual(2)

      // The person withdraws one; the therapist's prep no longer has it, and still has the other.
      await page.goto(`${origin}/journal/${secondId}`)
      await page.locator('[data-test=entry-share-withdraw]').click()
      await page.getByText('What they already read or printed may be in their own records.').waitFor()
      await page.getByRole('button', { name: 'Withdraw' }).last().click()
      await page.locator('[data-test=share-state-withdrawn]').waitFor({ timeout: 15_000 })
      await tpage.reload()
      await prepEntries.filter({ hasText: firstEdited }).waitFor()
      expect(await prepEntries.filter({ hasText: second }).count()).toBe(0)

      // Nothing left this machine.
      const all = [...urls, ...therapistUrls].filter((u) => u.startsWith('http'))
      expect(all.length).toBeGreaterThan(0)
      expect(all.filter((u) => new URL(u).origin !== origin)).toEqual([])
    } finally {
      await person.close()
      await therapist.close()
    }
  })
})
