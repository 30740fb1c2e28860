// Screenshots of the person's sharing screens (Sharing page, share preview) for looking at: npx tsx tests/tools/shareScreens.ts [baseUrl]
import fs from 'node:fs'
import { freshContext } from '../helpers/chromium'
import { signInThroughForm } from '../helpers/e2eServer'
import { saveMoment } from '../helpers/journalFlows'

const base = process.argv[2] ?? 'http://localhost:3000'
fs.mkdirSync('.screens', { recursive: true })
for (const [size, w, h] of [['phone', 390, 844], ['desktop', 1280, 800]] as const) {
  const { context, close } = await freshContext({ width: w, height: h })
  const page = await context.newPage()
  await signInThroughForm(page, base, 'robin.ashdown@example.org', 'demo-person-orchard')
  await page.goto(base + '/more/share')
  await page.waitForTimeout(1200)
  await page.screenshot({ path: `.screens/share-${size}.png`, fullPage: true })
  await page.goto(base)
  await saveMoment(page, 'Said no to the extra shift and felt shaky, then relieved.')
  await page.locator('[data-test=entry-card]').first().click()
  await page.waitForTimeout(800)
  await page.screenshot({ path: `.screens/entry-share-${size}.png`, fullPage: true })
  const share = page.getByRole('button', { name: /Share with/ }).first()
  if (await share.count()) {
    await share.click()
    await page.waitForTimeout(600)
    await page.screenshot({ path: `.screens/share-preview-${size}.png` })
  }
  await close()
}
console.log('screenshots in .screens/')
