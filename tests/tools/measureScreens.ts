// Screenshots of the questionnaire screens at phone and desktop size, for looking at by eye:
// npx tsx tests/tools/measureScreens.ts [baseUrl]
import fs from 'node:fs'
import type { Entry } from '../../shared/schemas/entry.schema'
import type { ItemAnswer } from '../../shared/schemas/measure.schema'
import { freshContext } from '../helpers/chromium'
import { seedDevice } from '../helpers/deviceSeed'

const base = process.argv[2] ?? 'http://localhost:3000'
const out = '.screens/measures'
fs.mkdirSync(out, { recursive: true })
const DAY = 86_400_000

// An invented course of fortnightly forms; no real person.
function measure(instrument: 'phq9' | 'gad7', answers: ItemAnswer[], daysAgo: number): Entry & { words: string[] } {
  const at = Date.now() - daysAgo * DAY
  return { id: crypto.randomUUID(), kind: 'measure', createdAt: at, updatedAt: at, version: 1, body: '', wants: [], backgroundThoughts: [], tags: [], shares: [], words: [], measure: { instrument, answers, difficulty: 1, completedAt: at + 120_000 } }
}
const seeded = [
  measure('phq9', [2, 2, 2, 1, 2, 1, 1, 1, 0], 70),
  measure('phq9', [2, 1, 2, 1, 1, 1, 1, 0, 0], 56),
  measure('phq9', [1, 1, 2, 1, 1, 1, 1, 0, 0], 42),
  measure('phq9', [1, 1, 1, 1, 1, 0, 1, 0, 0], 28),
  measure('phq9', [1, 0, 1, 1, 0, 0, 1, 0, 0], 14),
  measure('gad7', [2, 2, 2, 1, 1, 1, 1], 70),
  measure('gad7', [1, 2, 1, 1, 1, 1, 1], 42),
  measure('gad7', [1, 1, 1, 1, 0, 1, 1], 14),
]

for (const [size, w, h] of [['phone', 390, 844], ['desktop', 1280, 800]] as const) {
  const { context, close } = await freshContext({ width: w, height: h })
  const page = await context.newPage()
  page.on('pageerror', (e) => console.error('page error:', e.message))
  await page.goto(`${base}/measures/new/phq9`)
  await page.locator('[data-test=measure-question]').waitFor()
  await page.locator('[data-test=measure-choice-2]').click()
  await page.waitForTimeout(300)
  await page.screenshot({ path: `${out}/${size}-question.png` })
  await page.locator('[data-test=measure-next]').click()
  for (const a of [1, 2, 1, 0, 1, 1, 0]) {
    await page.locator(`[data-test=measure-choice-${a}]`).click()
    await page.locator('[data-test=measure-next]').click()
  }
  await page.locator('[data-test=measure-choice-1]').click()
  await page.locator('[data-test=measure-selfharm-card]').waitFor()
  await page.waitForTimeout(400)
  await page.screenshot({ path: `${out}/${size}-item9-card.png` })
  await page.screenshot({ path: `${out}/${size}-item9-card-full.png`, fullPage: true })
  await page.locator('[data-test=measure-next]').click()
  await page.locator('[data-test=measure-choice-1]').click()
  await page.locator('[data-test=measure-finish]').click()
  await page.locator('[data-test=measure-score]').waitFor()
  await page.waitForTimeout(400)
  await page.screenshot({ path: `${out}/${size}-result.png` })
  await page.screenshot({ path: `${out}/${size}-result-full.png`, fullPage: true })
  await seedDevice(page, seeded)
  await page.evaluate(async () => {
    const db = await new Promise<IDBDatabase>((resolve, reject) => {
      const r = indexedDB.open('rungs')
      r.onsuccess = () => resolve(r.result)
      r.onerror = () => reject(r.error)
    })
    await new Promise<void>((resolve, reject) => {
      const tx = db.transaction('earlierScores', 'readwrite')
      tx.objectStore('earlierScores').put({ id: 'es-demo', linkId: 'link-demo', instrument: 'phq9', takenOn: new Date(Date.now() - 90 * 86_400_000).toISOString().slice(0, 10), total: 19, item9: null, enteredBy: 'Dr Ines Marlow', enteredAt: new Date().toISOString(), syncedAt: Date.now() })
      tx.oncomplete = () => resolve()
      tx.onerror = () => reject(tx.error)
    })
    db.close()
  })
  await page.goto(`${base}/measures`)
  await page.locator('[data-test=measure-history-phq9]').waitFor()
  await page.waitForTimeout(800)
  await page.screenshot({ path: `${out}/${size}-measures.png` })
  await page.screenshot({ path: `${out}/${size}-measures-full.png`, fullPage: true })
  await page.locator('[data-test=measure-history-phq9]').scrollIntoViewIfNeeded()
  await page.screenshot({ path: `${out}/${size}-measures-chart.png` })
  await close()
}
console.log(`screenshots in ${out}/`)
