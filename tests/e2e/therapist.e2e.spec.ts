import { randomUUID } from 'node:crypto'
import fs from 'node:fs'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Entry } from '../../shared/schemas/entry.schema'
import { demoAccounts } from '../../server/db/seed'
import { freshContext } from '../helpers/chromium'
import { signInThroughForm, startE2eServer } from '../helpers/e2eServer'
import { seriousViolations } from '../helpers/axe'
import { signInOverFetch, type ApiCall } from '../helpers/apiSession'

const now = Date.now()
const tug: Entry = {
  id: randomUUID(),
  kind: 'tug',
  createdAt: now - 60 * 60 * 1000,
  updatedAt: now - 60 * 60 * 1000,
  version: 1,
  body: 'Whether to go to my sister’s birthday',
  distressBefore: 70,
  distressAfter: 45,
  wants: [
    { text: 'Stay home and rest', importance: 8, ladder: [{ id: 'a1', text: 'Not be overwhelmed' }, { id: 'a2', text: 'Feel steady in myself' }] },
    { text: 'Go to the party', importance: 6, ladder: [{ id: 'b1', text: 'Show her I care' }, { id: 'b2', text: 'Feel close to my family' }] },
  ],
  meetingPoint: 'Feeling safe with the people I love',
  backgroundThoughts: ['I always let people down'],
  tags: ['family'],
  shares: [],
}
const riskWords = 'I keep thinking I want to end my life'
const moment: Entry = { id: randomUUID(), kind: 'moment', createdAt: now - 30 * 60 * 1000, updatedAt: now - 30 * 60 * 1000, version: 1, body: riskWords, distressBefore: 85, wants: [], backgroundThoughts: [], tags: [], shares: [] }
const noteText = 'Ask about the party and about the thoughts of ending things; check the safety plan.'

let server: Awaited<ReturnType<typeof startE2eServer>>
let person: ApiCall
let linkId = ''
beforeAll(async () => {
  server = await startE2eServer()
  person = await signInOverFetch(server.url, demoAccounts.person)
  const links = (await person('GET', '/api/person/links')).body.links as { id: string; state: string }[]
  linkId = links.find((l) => l.state === 'active')!.id
  for (const entry of [tug, moment]) {
    const put = await person('PUT', `/api/links/${linkId}/shares/${entry.id}`, { version: 1, payload: entry })
    expect(put.body.status).toBe('stored')
  }
  fs.mkdirSync('.screens', { recursive: true })
})
afterAll(async () => { await server?.close() })

describe('the therapist reads what was shared, in Chromium', () => {
  it('shows the caseload with new entries and a worded risk flag, and prep with both entries, notes and flags', async () => {
    const { context, close } = await freshContext({ width: 1280, height: 800 })
    const page = await context.newPage()
    await signInThroughForm(page, server.url, demoAccounts.therapist.email, demoAccounts.therapist.password)
    expect(new URL(page.url()).pathname).toBe('/therapist/caseload')

    const row = page.locator('[data-test=caseload-table] tbody tr').filter({ hasText: demoAccounts.person.displayName })
    await row.waitFor()
    expect((await row.locator('td').nth(2).textContent())?.trim()).toBe('2')
    expect(await row.locator('[data-test=risk-flag]').textContent()).toContain('Flagged: risk words or PHQ-9 question 9')
    // At 1280 px the flag's words wrap inside their cell and the table needs no sideways scroll to show them.
    const fits = await row.locator('[data-test=risk-flag]').evaluate((el) => {
      const cell = el.closest('td')!.getBoundingClientRect()
      const flag = el.getBoundingClientRect()
      const table = el.closest('.q-table__middle')!
      return flag.right <= cell.right + 0.5 && table.scrollWidth <= table.clientWidth
    })
    expect(fits).toBe(true)
    expect(await page.locator('[data-test=flag-note]').textContent()).toContain('follow your local risk procedures')
    expect(await seriousViolations(page)).toEqual([])
    await page.screenshot({ path: '.screens/caseload-1280.png', fullPage: true })

    await row.locator('td').nth(3).click()
    await page.waitForURL((u) => u.pathname === `/therapist/prep/${linkId}`)
    await page.locator('[data-test=prep-name]').waitFor()
    expect(await page.locator('[data-test=prep-name]').textContent()).toBe(demoAccounts.person.displayName)
    expect(await page.locator('[data-test=prep-since]').textContent()).toMatch(/^Since the last session \(\w+day \d{1,2} \w+ \d{4}\)$/)
    const entries = page.locator('[data-test=prep-entry]')
    // The shares load after the header; wait for them rather than count at once.
    await entries.nth(1).waitFor()
    expect(await entries.count()).toBe(2)
    const tugCard = entries.filter({ hasText: 'Stay home and rest' })
    for (const text of ['Not be overwhelmed', 'Feel steady in myself', 'Show her I care', 'Feel close to my family', 'I always let people down']) {
      expect(await tugCard.getByText(text, { exact: true }).isVisible()).toBe(true)
    }
    expect(await tugCard.locator('[data-test=meeting-point]').textContent()).toContain('Feeling safe with the people I love')
    expect(await tugCard.locator('[data-test=entry-distress]').textContent()).toContain('before 70, after 45')
    expect(await tugCard.locator('[data-test=entry-risk-flag]').count()).toBe(0)
    const momentCard = entries.filter({ hasText: riskWords })
    expect(await momentCard.locator('[data-test=entry-risk-flag]').isVisible()).toBe(true)

    await momentCard.locator('[data-test=mark-read]').click()
    await momentCard.locator('[data-test=mark-read][aria-pressed=true]').waitFor()
    await momentCard.locator('[data-test=to-discuss]').click()
    await momentCard.locator('[data-test=to-discuss][aria-pressed=true]').waitFor()
    const stored = await server.deps.models.SharedEntry.findOne({ where: { linkId, entryId: moment.id } })
    expect(stored?.readAt).toBeInstanceOf(Date)
    expect(stored?.toDiscuss).toBe(true)
    const untouched = await server.deps.models.SharedEntry.findOne({ where: { linkId, entryId: tug.id } })
    expect(untouched?.readAt).toBeNull()

    expect(await page.locator('[data-test=notes-private]').textContent()).toBe("Your working notes. They are never shown in the person's app.")
    await page.getByLabel('A new note').fill(noteText)
    await page.locator('[data-test=note-add]').click()
    await page.locator('[data-test=note]').filter({ hasText: noteText }).waitFor()
    expect(await server.deps.models.PrepNote.count({ where: { linkId } })).toBe(1)
    const personSees = await person('GET', `/api/person/links/${linkId}/shares`)
    expect(personSees.status).toBe(200)
    expect(JSON.stringify(personSees.body)).not.toContain('party and about')

    expect(await seriousViolations(page)).toEqual([])
    await page.screenshot({ path: '.screens/prep-1280.png', fullPage: true })
    await close()
  })

  it('works on a phone: caseload cards and a readable prep page', async () => {
    const { context, close } = await freshContext({ width: 390, height: 844 })
    const page = await context.newPage()
    await signInThroughForm(page, server.url, demoAccounts.therapist.email, demoAccounts.therapist.password)
    const card = page.locator('[data-test=caseload-card]').filter({ hasText: demoAccounts.person.displayName })
    await card.waitFor()
    expect(await card.locator('[data-test=risk-flag]').textContent()).toContain('Flagged: risk words or PHQ-9 question 9')
    expect(await card.textContent()).toContain('To discuss1')
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390)
    expect(await seriousViolations(page)).toEqual([])
    await page.screenshot({ path: '.screens/caseload-390.png', fullPage: true })
    await card.click()
    await page.locator('[data-test=prep-entry]').first().waitFor()
    expect(await page.locator('[data-test=prep-entry]').count()).toBe(2)
    const width = await page.evaluate(() => document.documentElement.scrollWidth)
    expect(width).toBeLessThanOrEqual(390)
    expect(await seriousViolations(page)).toEqual([])
    await page.screenshot({ path: '.screens/prep-390.png', fullPage: true })
    await close()
  })

  it('makes an invitation code shown once and lists it as open', async () => {
    const { context, close } = await freshContext({ width: 1280, height: 800 })
    const page = await context.newPage()
    await signInThroughForm(page, server.url, demoAccounts.therapist.email, demoAccounts.therapist.password)
    await page.goto(server.url + '/therapist/invitations')
    await page.getByLabel('Their e-mail (optional)').fill('sam.e2e@example.org')
    await page.locator('[data-test=invite-create]').click()
    const code = page.locator('[data-test=invite-code]')
    await code.waitFor()
    expect(await code.textContent()).toMatch(/^[A-HJ-NP-Z2-9]{4}-[A-HJ-NP-Z2-9]{4}$/)
    expect(await page.locator('[data-test=invite-code-box]').textContent()).toContain('expires in 7 days')
    await page.locator('[data-test=invitation]').filter({ hasText: 'sam.e2e@example.org' }).waitFor()
    expect(await server.deps.models.Invitation.count({ where: { email: 'sam.e2e@example.org' } })).toBe(1)
    expect(await seriousViolations(page)).toEqual([])
    await page.screenshot({ path: '.screens/invitations-1280.png', fullPage: true })
    await close()
  })

  it('tells a therapist who is not approved yet, with a way to Settings', async () => {
    const { context, close } = await freshContext({ width: 1280, height: 800 })
    const page = await context.newPage()
    await signInThroughForm(page, server.url, demoAccounts.pendingTherapist.email, demoAccounts.pendingTherapist.password)
    const box = page.locator('[data-test=not-approved]')
    await box.waitFor()
    expect(await box.getByRole('link', { name: 'Settings' }).getAttribute('href')).toBe('/therapist/settings')
    expect(await page.locator('[data-test=caseload-table]').count()).toBe(0)
    await close()
  })

  it('ends the link after a warning that offers printing first, removing the shared copies', async () => {
    const { context, close } = await freshContext({ width: 1280, height: 800 })
    const page = await context.newPage()
    await signInThroughForm(page, server.url, demoAccounts.therapist.email, demoAccounts.therapist.password)
    await page.goto(`${server.url}/therapist/prep/${linkId}`)
    await page.locator('[data-test=end-link]').click()
    const dialog = page.getByRole('alertdialog')
    await dialog.waitFor()
    expect(await dialog.textContent()).toContain('removes every shared copy from Rungs')
    expect(await dialog.locator('[data-test=print-first]').isVisible()).toBe(true)
    await page.screenshot({ path: '.screens/end-link-1280.png' })
    await dialog.locator('[data-test=end-link-confirm]').click()
    await page.waitForURL((u) => u.pathname === '/therapist/caseload')
    await page.locator('[data-test=caseload-empty]').waitFor()
    expect(await page.locator('[data-test=caseload-empty]').textContent()).toContain('No one is linked yet')
    const link = await server.deps.models.Link.findByPk(linkId)
    expect(link?.state).toBe('ended')
    expect(await server.deps.models.SharedEntry.count({ where: { linkId, payload: null } })).toBe(2)
    await close()
  })
})
