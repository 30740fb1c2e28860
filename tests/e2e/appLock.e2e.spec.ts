import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Page } from 'playwright-core'
import { seriousViolations } from '../helpers/axe'
import { freshContext } from '../helpers/chromium'
import { startE2eServer } from '../helpers/e2eServer'
import { saveMoment } from '../helpers/journalFlows'
import { seedDevice } from '../helpers/deviceSeed'

let server: Awaited<ReturnType<typeof startE2eServer>>
beforeAll(async () => { server = await startE2eServer() })
afterAll(async () => { await server?.close() })

const MOMENT = 'Watched the gulls wheel over the allotments'
const PASSCODE = '482913'

const planEntry = {
  id: '6f0c2a53-3d7e-4b8e-9a51-0c8e6b7f1a22',
  kind: 'safetyPlan' as const,
  createdAt: Date.now() - 86_400_000,
  updatedAt: Date.now() - 86_400_000,
  version: 1,
  body: '',
  wants: [],
  backgroundThoughts: [],
  tags: [],
  shares: [],
  safetyPlan: {
    warningSigns: ['Not answering messages'],
    onMyOwn: ['Walk round the block'],
    peopleAndPlaces: [],
    askForHelp: [{ name: 'Marguerite', phone: '07700 900789' }],
    professionals: [],
    saferSurroundings: [],
    reasonToKeepGoing: 'The garden in June',
  },
  words: [],
}

/** Notes, from before the app's first script runs, whether the marker text was ever in the page. */
async function watchForText(page: Page, marker: string) {
  await page.addInitScript((text) => {
    const w = window as unknown as { __seen: boolean }
    w.__seen = false
    new MutationObserver(() => { if (document.body?.textContent?.includes(text)) w.__seen = true }).observe(document, { subtree: true, childList: true, characterData: true })
  }, marker)
}
const everShown = (page: Page) => page.evaluate(() => (window as unknown as { __seen: boolean }).__seen)

describe('the app lock in Chromium', () => {
  it('covers the journal from the first paint after a reload, keeps Help now and the safety plan reachable, and opens with the passcode', async () => {
    const { context, close } = await freshContext()
    const page = await context.newPage()
    await page.goto(server.url)
    await page.getByRole('heading', { name: 'A moment', exact: true }).waitFor()
    await saveMoment(page, MOMENT)
    await seedDevice(page, [planEntry])

    await page.goto(`${server.url}/more/settings`)
    await page.locator('[data-test=lock-passcode]').fill(PASSCODE)
    await page.locator('[data-test=lock-passcode-repeat]').fill(PASSCODE)
    await page.locator('[data-test=lock-idle-new]').click()
    await page.getByRole('option', { name: 'As soon as I leave Rungs' }).click()
    await page.locator('[data-test=lock-on]').click()
    await page.getByText('The app lock is on.').first().waitFor()

    // Only a salted hash is stored, never the passcode.
    const stored = await page.evaluate(async () => {
      const db = await new Promise<IDBDatabase>((resolve, reject) => {
        const r = indexedDB.open('rungs')
        r.onsuccess = () => resolve(r.result)
        r.onerror = () => reject(r.error)
      })
      const row = await new Promise<unknown>((resolve) => {
        const req = db.transaction('settings').objectStore('settings').get('appLock')
        req.onsuccess = () => resolve(req.result)
      })
      db.close()
      return JSON.stringify(row)
    })
    expect(stored).toContain('"hash"')
    expect(stored).toContain('"salt"')
    expect(stored).not.toContain(PASSCODE)

    await watchForText(page, MOMENT)
    await page.goto(server.url + '/journal')
    const lock = page.locator('[data-test=app-lock]')
    await lock.waitFor()
    await page.getByRole('heading', { name: 'Rungs is locked' }).waitFor()
    expect(await page.content()).not.toContain(MOMENT)
    expect(await everShown(page)).toBe(false)
    expect(await seriousViolations(page), 'the lock screen').toEqual([])

    // Help now opens on top of the lock, and its safety plan button shows the plan on the lock screen.
    await page.locator('[data-test=lock-help-now]').click()
    const help = page.getByRole('dialog')
    await help.getByRole('heading', { name: 'Help now' }).waitFor()
    expect(await help.locator('[data-test=emergency-call]').getAttribute('href')).toBe('tel:999') // REFERENCE §5: UK 999 [C]
    await help.getByRole('button', { name: 'My safety plan' }).click()
    const plan = page.locator('[data-test=lock-plan]')
    await plan.waitFor()
    await plan.getByText('The garden in June').waitFor()
    expect(await plan.getByRole('link', { name: 'Call Marguerite on 07700 900789' }).getAttribute('href')).toBe('tel:07700900789')
    expect(await page.content()).not.toContain(MOMENT)
    expect(await seriousViolations(page), 'the lock screen safety plan').toEqual([])
    await page.locator('[data-test=lock-plan-back]').click()

    // A wrong passcode is refused and the journal stays covered.
    await page.locator('[data-test=lock-code]').fill('000000')
    await page.locator('[data-test=lock-unlock]').click()
    await page.locator('[data-test=lock-error]').waitFor()
    expect(await page.content()).not.toContain(MOMENT)
    expect(await everShown(page)).toBe(false)

    await page.locator('[data-test=lock-code]').fill(PASSCODE)
    await page.locator('[data-test=lock-unlock]').click()
    await page.getByText(MOMENT).first().waitFor()
    expect(await lock.count()).toBe(0)

    // "Immediately": leaving the app locks it again.
    await page.evaluate(() => {
      Object.defineProperty(document, 'visibilityState', { value: 'hidden', configurable: true })
      document.dispatchEvent(new Event('visibilitychange'))
    })
    await lock.waitFor()
    expect(await page.content()).not.toContain(MOMENT)
    await close()
  })
})
