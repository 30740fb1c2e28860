import { execFileSync } from 'node:child_process'
import fs from 'node:fs'
import os from 'node:os'
import path from 'node:path'
import { endOfDay, format, startOfDay, subDays } from 'date-fns'
import { PDFDocument } from 'pdf-lib'
import { afterAll, describe, expect, it } from 'vitest'
import { searchWords } from '../../shared/content/searchWords'
import type { Entry } from '../../shared/schemas/entry.schema'
import { seriousViolations } from '../helpers/axe'
import { freshContext } from '../helpers/chromium'
import { seedDevice } from '../helpers/deviceSeed'
import { startE2eServer } from '../helpers/e2eServer'

let server: Awaited<ReturnType<typeof startE2eServer>> | undefined
afterAll(async () => { await server?.close() })

const HOUR = 3_600_000
const screens = path.resolve('.screens/summary')
const squash = (s: string) => s.replace(/\s+/g, ' ')

function row(e: Omit<Entry, 'id' | 'updatedAt' | 'version' | 'shares' | 'backgroundThoughts' | 'tags' | 'wants'> & Partial<Entry>): Entry & { words: string[] } {
  const entry: Entry = { id: crypto.randomUUID(), updatedAt: e.createdAt, version: 1, shares: [], backgroundThoughts: [], tags: [], wants: [], ...e }
  return { ...entry, words: searchWords(entry.body) }
}

// An invented fortnight: three moments (one to leave out), a tug with both ladders, a PHQ-9 and a safety plan.
function journal(now: number): (Entry & { words: string[] })[] {
  return [
    row({ kind: 'moment', createdAt: now - 2 * HOUR, body: 'Heron on the towpath, breathing slower', distressBefore: 30, tags: ['body'] }),
    row({ kind: 'moment', createdAt: now - 30 * HOUR, body: 'Marmalade argument with my brother, café afterwards', distressBefore: 65 }),
    row({ kind: 'moment', createdAt: now - 50 * HOUR, body: 'Private note about the quince tree, keep out', distressBefore: 50 }),
    row({
      kind: 'tug',
      createdAt: now - 4 * 24 * HOUR,
      body: 'Staying late at the depot or going home',
      distressBefore: 72,
      distressAfter: 40,
      wants: [
        { text: 'Leave at five', importance: 7, ladder: [{ id: 'a1', text: 'Evenings with the children' }, { id: 'a2', text: 'Being a present parent' }] },
        { text: 'Finish the rota', importance: 6, ladder: [{ id: 'b1', text: 'Keeping the team steady' }] },
      ],
      meetingPoint: 'Looking after the people I love',
    }),
    row({ kind: 'measure', createdAt: now - 3 * 24 * HOUR, body: '', measure: { instrument: 'phq9', answers: [1, 1, 1, 1, 1, 1, 1, 1, 0], completedAt: now - 3 * 24 * HOUR } }),
    row({
      kind: 'safetyPlan',
      createdAt: now - 9 * 24 * HOUR,
      body: '',
      safetyPlan: { warningSigns: ['Skipping meals'], onMyOwn: ['Cold water on my wrists'], peopleAndPlaces: [], askForHelp: [], professionals: [], saferSurroundings: [], reasonToKeepGoing: 'My niece' },
    }),
  ]
}

describe('appointment summary PDF', () => {
  it('builds offline from chosen entries, with Lora embedded, page numbers and the date range on every page', async () => {
    fs.mkdirSync(screens, { recursive: true })
    server = await startE2eServer()
    const { context, close } = await freshContext()
    const page = await context.newPage()
    const errors: string[] = []
    page.on('pageerror', (e) => errors.push(e.message))
    await page.goto(server.url)
    await page.getByRole('heading', { name: 'A moment', exact: true }).waitFor()
    const now = Date.now()
    await seedDevice(page, journal(now))
    await page.evaluate(() => navigator.serviceWorker.ready.then(() => undefined))
    await page.reload()
    await page.waitForFunction(() => navigator.serviceWorker.controller !== null)
    // Offline for real: the server is gone too, so the worker's precache is all there is.
    const base = server.url
    await server.close()
    server = undefined
    await context.setOffline(true)

    await page.goto(`${base}/more/summary`)
    await page.getByRole('heading', { name: 'Summary for an appointment' }).waitFor()
    // No link on this device, so "since the last session" falls back to 14 days and says so.
    await page.locator('[data-test=summary-period-note]').getByText('last 14 days').waitFor()
    const rows = page.locator('[data-test=summary-entry]')
    await rows.first().waitFor()
    expect(await rows.count()).toBe(4)
    expect(await seriousViolations(page)).toEqual([])
    await rows.filter({ hasText: 'quince tree' }).getByRole('checkbox').click()
    expect(await page.locator('[data-test=summary-entry-count]').textContent()).toContain('3 of 4 chosen')
    await page.getByRole('checkbox', { name: 'Include my safety plan' }).click()
    await page.getByLabel('Something I want to bring up').fill('Ask about the sleep diary ≥ 2 weeks 🙂')
    await page.getByRole('button', { name: 'Add' }).click()
    await page.locator('[data-test=bring-up-item]').first().waitFor()
    await page.screenshot({ path: path.join(screens, 'summary-390.png'), fullPage: true })

    const downloading = page.waitForEvent('download')
    await page.getByRole('button', { name: 'Make the PDF' }).click()
    // A picture of the progress if it is still on screen; the build may already be done, which is fine.
    await page.locator('[data-test=summary-progress]').screenshot({ path: path.join(screens, 'summary-progress-390.png'), timeout: 2000 }).catch(() => undefined)
    const download = await downloading
    expect(download.suggestedFilename()).toBe(`rungs-summary-${format(now, 'yyyy-MM-dd')}.pdf`)
    const file = path.join(fs.mkdtempSync(path.join(os.tmpdir(), 'rungs-summary-')), download.suggestedFilename())
    await download.saveAs(file)

    const doc = await PDFDocument.load(fs.readFileSync(file))
    const pages = doc.getPageCount()
    expect(pages).toBeGreaterThanOrEqual(1)
    const fonts = execFileSync('pdffonts', [file], { encoding: 'utf8' }).split('\n').filter((l) => /\+Lora/.test(l))
    expect(fonts.length).toBeGreaterThanOrEqual(2)
    // name type encoding emb sub uni: embedded and a subset.
    for (const f of fonts) expect(f).toMatch(/\syes\s+yes\s+yes\s/)

    const text = execFileSync('pdftotext', ['-layout', file, '-'], { encoding: 'utf8' })
    const flat = squash(text)
    for (const chosen of ['Heron on the towpath, breathing slower', 'Marmalade argument with my brother, café afterwards', 'Evenings with the children', 'Keeping the team steady', 'Looking after the people I love', '8 of 27', 'mild', 'Cold water on my wrists', 'Ask about the sleep diary >= 2 weeks'])
      expect(flat).toContain(chosen)
    expect(flat).not.toContain('quince')
    const range = `${format(startOfDay(subDays(now, 13)), 'd MMM yyyy')} – ${format(endOfDay(now), 'd MMM yyyy')}`
    const perPage = text.split('\f').filter((p) => p.trim())
    expect(perPage).toHaveLength(pages)
    perPage.forEach((p, i) => {
      expect(p).toContain(`Page ${i + 1} of ${pages}`)
      expect(p).toContain(range)
    })
    execFileSync('pdftoppm', ['-png', '-r', '80', '-f', '1', '-l', '1', file, path.join(screens, 'pdf-page')])
    expect(fs.readdirSync(screens).some((f) => /^pdf-page-0*1\.png$/.test(f))).toBe(true)

    await page.setViewportSize({ width: 1280, height: 800 })
    await page.screenshot({ path: path.join(screens, 'summary-1280.png'), fullPage: true })
    // The bring-up list stays on the device for next time.
    await page.reload()
    await page.locator('[data-test=bring-up-item]').first().waitFor()
    expect(errors).toEqual([])
    await close()
  })

  it('passes axe in dark mode, with the safety plan choice disabled and explained when there is no plan', async () => {
    server ??= await startE2eServer()
    const { context, close } = await freshContext({ colorScheme: 'dark', width: 1280, height: 800, locale: 'en-US' })
    const page = await context.newPage()
    await page.goto(server.url)
    await page.getByRole('heading', { name: 'A moment', exact: true }).waitFor()
    await seedDevice(page, journal(Date.now()).filter((e) => e.kind !== 'safetyPlan'))
    await page.goto(`${server.url}/more/summary`)
    await page.locator('[data-test=summary-entry]').first().waitFor()
    expect(await page.getByRole('checkbox', { name: 'Include my safety plan' }).getAttribute('aria-disabled')).toBe('true')
    await page.getByText('There is no safety plan on this device yet').waitFor()
    // Letter is the default paper in the US.
    expect(await page.getByRole('radio', { name: 'Letter' }).getAttribute('aria-checked')).toBe('true')
    expect(await page.getByRole('radio', { name: 'A4' }).getAttribute('aria-checked')).toBe('false')
    expect(await seriousViolations(page)).toEqual([])
    await page.screenshot({ path: path.join(screens, 'summary-1280-dark.png') })
    await close()
  })
})
