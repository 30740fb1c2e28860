// Screenshots of the journal flows at phone and desktop size, for looking at by eye: npx tsx tests/tools/journalScreens.ts [baseUrl]
import fs from 'node:fs'
import { freshContext } from '../helpers/chromium'
import { seedDevice, seedEntries } from '../helpers/deviceSeed'
import { sampleTug, saveMoment, writeTug } from '../helpers/journalFlows'

const base = process.argv[2] ?? 'http://localhost:3000'
const out = '.screens'
fs.mkdirSync(out, { recursive: true })
for (const [size, w, h] of [['phone', 390, 844], ['desktop', 1280, 800]] as const) {
  for (const dark of [false, true]) {
    const tag = `${size}${dark ? '-dark' : ''}`
    const { context, close } = await freshContext({ width: w, height: h, colorScheme: dark ? 'dark' : 'light' })
    const page = await context.newPage()
    page.on('pageerror', (e) => console.error('page error:', e.message))
    await page.goto(base)
    await page.waitForTimeout(600)
    await page.screenshot({ path: `${out}/j-${tag}-today-first.png` })
    await page.locator('[data-test=first-run-ok]').click()
    await saveMoment(page, 'Woke at 4am with my chest tight about the meeting.')
    await writeTug(page, { ...sampleTug, onStep: async (name) => { if (!dark) await page.screenshot({ path: `${out}/j-${tag}-tug-${name}.png`, fullPage: true }) } })
    await page.waitForTimeout(400)
    await page.screenshot({ path: `${out}/j-${tag}-entry.png`, fullPage: true })
    await page.goto(base + '/journal')
    await page.waitForTimeout(600)
    await page.screenshot({ path: `${out}/j-${tag}-journal.png` })
    await seedDevice(page, seedEntries(60, 30))
    await page.goto(base + '/patterns')
    await page.waitForTimeout(1200)
    await page.screenshot({ path: `${out}/j-${tag}-patterns.png`, fullPage: true })
    await page.goto(base + '/more/backup')
    await page.waitForTimeout(600)
    await page.screenshot({ path: `${out}/j-${tag}-backup.png`, fullPage: true })
    await page.goto(base)
    await page.waitForTimeout(600)
    await page.screenshot({ path: `${out}/j-${tag}-today.png`, fullPage: true })
    await close()
  }
}
console.log(`screenshots in ${out}/`)
