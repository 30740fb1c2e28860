// Screenshots of the app lock, the wipe dialog and the close-account dialog, for looking at by eye:
// npx tsx tests/tools/privacyScreens.ts   (needs `npm run build`; starts its own server)
import fs from 'node:fs'
import type { Page } from 'playwright-core'
import { demoAccounts } from '../../server/db/seed'
import { freshContext } from '../helpers/chromium'
import { seedDevice } from '../helpers/deviceSeed'
import { signInThroughForm, startE2eServer } from '../helpers/e2eServer'

const out = '.screens/privacy'
fs.mkdirSync(out, { recursive: true })
const server = await startE2eServer()
const plan = {
  id: '0d7f4a8e-1b2c-4d3e-8f90-a1b2c3d4e5f6', kind: 'safetyPlan', createdAt: Date.now(), updatedAt: Date.now(), version: 1, body: '', wants: [], backgroundThoughts: [], tags: [], shares: [], words: [],
  safetyPlan: {
    warningSigns: ['Not answering messages', 'Staying in bed past noon'], onMyOwn: ['Walk round the block', 'Shower and put the radio on'],
    peopleAndPlaces: ['The library café'], askForHelp: [{ name: 'Marguerite', phone: '07700 900789', note: 'evenings' }],
    professionals: [{ name: 'Samaritans', phone: '116 123' }], saferSurroundings: ['Ask my brother to keep the spare key'], reasonToKeepGoing: 'The garden in June',
  },
}

async function withLock(page: Page) {
  await page.goto(server.url)
  await page.getByRole('heading', { name: 'A moment', exact: true }).waitFor()
  await seedDevice(page, [plan as never])
  await page.goto(server.url + '/more/settings')
  await page.locator('[data-test=lock-passcode]').fill('482913')
  await page.locator('[data-test=lock-passcode-repeat]').fill('482913')
  await page.locator('[data-test=lock-on]').click()
  await page.getByText('The app lock is on.').first().waitFor()
  await page.reload()
  await page.locator('[data-test=app-lock]').waitFor()
  await page.waitForTimeout(400)
}

for (const [size, width, height] of [['phone', 390, 844], ['desktop', 1280, 800]] as const) {
  for (const scheme of ['light', 'dark'] as const) {
    const { context, close } = await freshContext({ width, height, colorScheme: scheme })
    const page = await context.newPage()
    await page.emulateMedia({ colorScheme: scheme })
    await page.goto(server.url)
    await page.evaluate((s) => localStorage.setItem('rungs.appearance', s), scheme)
    await withLock(page)
    await page.screenshot({ path: `${out}/${size}-${scheme}-lock.png` })
    await page.locator('[data-test=lock-safety-plan]').click()
    await page.locator('[data-test=lock-plan]').waitFor()
    await page.waitForTimeout(300)
    await page.screenshot({ path: `${out}/${size}-${scheme}-lock-plan.png`, fullPage: true })
    await page.locator('[data-test=lock-plan-back]').click()
    await page.locator('[data-test=lock-code]').fill('111111')
    for (let i = 0; i < 5; i++) {
      await page.locator('[data-test=lock-unlock]').click()
      await page.locator('[data-test=lock-error]').waitFor()
      await page.waitForTimeout(300)
      if (i < 4) await page.locator('[data-test=lock-code]').fill('111111')
    }
    await page.locator('[data-test=lock-forgot]').click()
    await page.waitForTimeout(300)
    await page.screenshot({ path: `${out}/${size}-${scheme}-lock-wait-forgot.png`, fullPage: true })
    await page.locator('[data-test=lock-wipe]').click()
    await page.locator('[data-test=wipe-dialog]').waitFor()
    await page.waitForTimeout(400)
    await page.screenshot({ path: `${out}/${size}-${scheme}-lock-wipe.png` })
    await close()

    const second = await freshContext({ width, height, colorScheme: scheme })
    const p2 = await second.context.newPage()
    await p2.goto(server.url)
    await p2.evaluate((s) => localStorage.setItem('rungs.appearance', s), scheme)
    await signInThroughForm(p2, server.url, demoAccounts.person.email, demoAccounts.person.password)
    await p2.goto(server.url + '/more/settings')
    await p2.locator('[data-test=wipe-open]').click()
    await p2.locator('[data-test=wipe-dialog]').waitFor()
    await p2.locator('[data-test=wipe-word]').fill('WIPE')
    await p2.waitForTimeout(400)
    await p2.screenshot({ path: `${out}/${size}-${scheme}-wipe.png` })
    await p2.keyboard.press('Escape')
    await p2.goto(server.url + '/more/privacy')
    await p2.getByRole('heading', { name: 'Your data' }).waitFor()
    await p2.waitForTimeout(300)
    await p2.screenshot({ path: `${out}/${size}-${scheme}-privacy.png` })
    await p2.locator('[data-test=privacy-close]').click()
    await p2.locator('[data-test=close-account-dialog]').waitFor()
    await p2.waitForTimeout(400)
    await p2.screenshot({ path: `${out}/${size}-${scheme}-close-account.png` })
    await second.close()
  }
}
await server.close()
process.exit(0)
