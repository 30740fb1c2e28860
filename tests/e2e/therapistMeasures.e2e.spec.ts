import { randomUUID } from 'node:crypto'
import fs from 'node:fs'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Entry } from '../../shared/schemas/entry.schema'
import { demoAccounts } from '../../server/db/seed'
import { signInOverFetch, type ApiCall } from '../helpers/apiSession'
import { seriousViolations } from '../helpers/axe'
import { freshContext } from '../helpers/chromium'
import { signInThroughForm, startE2eServer } from '../helpers/e2eServer'

const now = Date.now()
// Robin's shared PHQ-9 after the demo intake score of 14: 8 (mild), −6, a reliable improvement (Talking Therapies: 6 points).
const phq9: Entry = {
  id: randomUUID(),
  kind: 'measure',
  createdAt: now - 2 * 86_400_000,
  updatedAt: now - 2 * 86_400_000,
  version: 1,
  body: '',
  wants: [],
  backgroundThoughts: [],
  tags: [],
  shares: [],
  measure: { instrument: 'phq9', answers: [1, 1, 1, 1, 1, 1, 1, 1, 0], completedAt: now - 2 * 86_400_000 },
}
const badCsv = 'date,measure,total,item9\n2026-08-01,PHQ-9,12,0\n2026-08-01,GAD-7,30,\n'

let server: Awaited<ReturnType<typeof startE2eServer>>
let person: ApiCall
let linkId = ''
beforeAll(async () => {
  server = await startE2eServer()
  person = await signInOverFetch(server.url, demoAccounts.person)
  const links = (await person('GET', '/api/person/links')).body.links as { id: string; state: string }[]
  linkId = links.find((l) => l.state === 'active')!.id
  expect((await person('PUT', `/api/links/${linkId}/shares/${phq9.id}`, { version: 1, payload: phq9 })).body.status).toBe('stored')
  fs.mkdirSync('.screens/therapist', { recursive: true })
  fs.writeFileSync(`${server.dataDir}/bad.csv`, badCsv)
})
afterAll(async () => { await server?.close() })

describe('the therapist reads measures and adds earlier scores, in Chromium', () => {
  it('shows PHQ-9 and GAD-7 on the caseload, the Measures section with earlier scores, and refuses a CSV with a bad row', async () => {
    const { context, close } = await freshContext({ width: 1280, height: 800 })
    const page = await context.newPage()
    await signInThroughForm(page, server.url, demoAccounts.therapist.email, demoAccounts.therapist.password)

    const row = page.locator('[data-test=caseload-table] tbody tr').filter({ hasText: demoAccounts.person.displayName })
    await row.waitFor()
    expect((await row.locator('[data-test=cell-phq9]').textContent())?.trim()).toBe('8 mild · −6')
    expect((await row.locator('[data-test=cell-gad7]').textContent())?.trim()).toBe('11 moderate')
    await page.screenshot({ path: '.screens/therapist/caseload-1280.png', fullPage: true })

    await row.getByRole('link', { name: demoAccounts.person.displayName }).click()
    const section = page.locator('[data-test=prep-measures]')
    await section.locator('[data-test=measures-table]').waitFor()
    expect(await section.locator('[data-test=measures-outcome]').textContent()).toContain('Reliable improvement on the depression questionnaire: PHQ-9 14 → 8')
    expect(await section.locator('[data-test=measures-rules]').textContent()).toContain('NHS Talking Therapies')
    expect(await section.locator('[data-test=entered-by-therapist]').count()).toBe(2)
    await section.locator('canvas').first().waitFor()
    expect(await section.locator('canvas').count()).toBe(2)
    // The shared questionnaire is not repeated in the entry list.
    expect(await page.locator('[data-test=prep-entry]').count()).toBe(0)
    expect(await page.locator('[data-test=new-measures-note]').textContent()).toContain('One questionnaire was shared')
    expect(await seriousViolations(page)).toEqual([])
    await page.screenshot({ path: '.screens/therapist/prep-measures-1280.png', fullPage: true })
    await section.locator('figure').first().screenshot({ path: '.screens/therapist/prep-chart-phq9-1280.png' })

    const download = page.waitForEvent('download')
    await section.locator('[data-test=download-csv]').click()
    const file = await download
    expect(file.suggestedFilename()).toBe('rungs-measures-robin.csv')

    await section.locator('[data-test=add-earlier]').click()
    const dialog = page.locator('[data-test=earlier-dialog]')
    await dialog.locator('[data-test=earlier-list] li').first().waitFor()
    expect(await dialog.locator('[data-test=earlier-list] li').count()).toBe(2)
    await dialog.locator('input[type=file]').setInputFiles(`${server.dataDir}/bad.csv`)
    await dialog.locator('[data-test=earlier-send]').click()
    const errors = dialog.locator('[data-test=earlier-row-errors]')
    await errors.waitFor()
    expect(await errors.textContent()).toContain('Row 3 · total: A GAD-7 total is at most 21.')
    expect(await dialog.locator('[data-test=earlier-problem]').textContent()).toContain('nothing was saved')
    expect(await seriousViolations(page)).toEqual([])
    await dialog.screenshot({ path: '.screens/therapist/earlier-dialog-errors-1280.png' })
    expect(await dialog.locator('[data-test=earlier-list] li').count()).toBe(2)
    await dialog.getByRole('button', { name: 'Close' }).click()
    await dialog.waitFor({ state: 'hidden' })
    expect(await section.locator('[data-test=entered-by-therapist]').count()).toBe(2)
    await close()
  })

  it('lays the Measures section and the caseload out on a phone, in dark mode', async () => {
    const { context, close } = await freshContext({ width: 390, height: 844, colorScheme: 'dark' })
    const page = await context.newPage()
    await signInThroughForm(page, server.url, demoAccounts.therapist.email, demoAccounts.therapist.password)
    const card = page.locator('[data-test=caseload-card]').filter({ hasText: demoAccounts.person.displayName })
    await card.waitFor()
    expect((await card.locator('[data-test=card-phq9]').textContent())?.trim()).toBe('8 mild · −6')
    await page.screenshot({ path: '.screens/therapist/caseload-390.png', fullPage: true })
    await card.click()
    const section = page.locator('[data-test=prep-measures]')
    await section.locator('canvas').first().waitFor()
    expect(await page.evaluate(() => document.body.classList.contains('body--dark'))).toBe(true)
    const width = await page.evaluate(() => document.documentElement.scrollWidth)
    expect(width).toBeLessThanOrEqual(390)
    expect(await seriousViolations(page)).toEqual([])
    expect(await section.locator('[data-test=entered-by-therapist]').count()).toBe(2)
    await page.screenshot({ path: '.screens/therapist/prep-measures-390.png', fullPage: true })
    await section.locator('figure').first().screenshot({ path: '.screens/therapist/prep-chart-phq9-390.png' })
    await close()
  })
})
