import fs from 'node:fs'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { demoAccounts } from '../../server/db/seed'
import { signInOverFetch } from '../helpers/apiSession'
import { seriousViolations } from '../helpers/axe'
import { freshContext } from '../helpers/chromium'
import { signInThroughForm, startE2eServer } from '../helpers/e2eServer'
import { saveMoment } from '../helpers/journalFlows'

// 0.1 minutes = 6 s without a request ends the session; the config accepts decimals for this.
const IDLE_MS = 6_000
let server: Awaited<ReturnType<typeof startE2eServer>>
beforeAll(async () => { server = await startE2eServer({ SESSION_IDLE_MINUTES: String(IDLE_MS / 60_000) }) })
afterAll(async () => { await server?.close() })

describe('a session that times out while a share waits', () => {
  it('keeps the share queued, offers to sign in again, returns to the entry and then sends it', async () => {
    fs.mkdirSync('.screens/auth', { recursive: true })
    const { context, close } = await freshContext()
    const page = await context.newPage()
    await signInThroughForm(page, server.url, demoAccounts.person.email, demoAccounts.person.password)
    await page.goto(server.url + '/more/share')
    await page.locator('[data-test^="link-"]').filter({ hasText: demoAccounts.therapist.displayName }).first().waitFor()

    // Offline, the share is queued on the device and nothing reaches the server.
    await page.goto(server.url + '/')
    const text = 'Watched the heron on the canal for a long while'
    await saveMoment(page, text)
    await page.locator('[data-test=entry-card]').filter({ hasText: 'heron' }).first().click()
    await page.waitForURL((u) => u.pathname.startsWith('/journal/'))
    const entryPath = new URL(page.url()).pathname
    const entryId = entryPath.split('/').pop()!
    await page.locator('[data-test=share-state-private]').waitFor()
    await context.setOffline(true)
    await page.locator('[data-test=entry-share-open]').click()
    await page.locator('[data-test=share-confirm]').click()
    await page.locator('[data-test=share-state-queued]').waitFor()

    // Longer than the idle timeout with no request at all; then the outbox tries and the server says session_expired.
    await page.waitForTimeout(IDLE_MS + 2_000)
    await context.setOffline(false)
    const notice = page.locator('[data-test=session-expired]')
    await notice.waitFor({ timeout: 15_000 })
    expect(await notice.textContent()).toContain('You were signed out after a while without use.')
    expect(await notice.textContent()).toContain('Nothing on this device is lost.')
    expect(await page.locator('[data-test=share-state-queued]').isVisible()).toBe(true)
    await page.waitForTimeout(800) // the notice slides in
    expect(await seriousViolations(page)).toEqual([])
    await page.screenshot({ path: '.screens/auth/session-expired-390.png' })
    await page.setViewportSize({ width: 1280, height: 800 })
    await page.screenshot({ path: '.screens/auth/session-expired-1280.png' })
    await page.setViewportSize({ width: 390, height: 844 })

    await notice.getByRole('button', { name: 'Sign in again' }).click()
    await page.waitForURL((u) => u.pathname === '/signin')
    expect(new URL(page.url()).searchParams.get('redirect')).toBe(entryPath)
    await page.locator('[data-test=signin-expired]').waitFor()
    await notice.waitFor({ state: 'detached' })
    await page.screenshot({ path: '.screens/auth/signin-after-expiry-390.png' })
    await page.getByLabel('E-mail', { exact: true }).fill(demoAccounts.person.email)
    await page.getByLabel('Password').fill(demoAccounts.person.password)
    await page.getByRole('button', { name: 'Sign in' }).click()

    await page.waitForURL((u) => u.pathname === entryPath)
    await page.locator('[data-test=share-state-shared]').waitFor({ timeout: 15_000 })

    const therapist = await signInOverFetch(server.url, demoAccounts.therapist)
    const links = (await therapist('GET', '/api/therapist/links')).body.links as { id: string; state: string; person: { displayName: string } }[]
    const link = links.find((l) => l.person.displayName === demoAccounts.person.displayName && l.state === 'active')!
    const shared = (await therapist('GET', `/api/therapist/links/${link.id}/shares`)).body.shares as { entryId: string; payload: { body: string } }[]
    expect(shared.filter((s) => s.entryId === entryId).map((s) => s.payload.body)).toEqual([text])
    await close()
  })
})

describe('sign out everywhere from the More page', () => {
  it('asks first, says the journal stays, and signs this device out', async () => {
    const { context, close } = await freshContext()
    const page = await context.newPage()
    await signInThroughForm(page, server.url, demoAccounts.person.email, demoAccounts.person.password)
    const other = await signInOverFetch(server.url, demoAccounts.person)
    expect((await other('GET', '/api/me')).status).toBe(200)

    await page.goto(server.url + '/more')
    await page.locator('[data-test=signout-everywhere]').click()
    const dialog = page.locator('[data-test=signout-everywhere-dialog]')
    await dialog.waitFor()
    expect(await dialog.textContent()).toContain('The journal on this device stays here')
    expect(JSON.stringify(await seriousViolations(page))).toBe('[]')
    await page.screenshot({ path: '.screens/auth/signout-everywhere-390.png' })
    await page.setViewportSize({ width: 1280, height: 800 })
    await page.screenshot({ path: '.screens/auth/signout-everywhere-1280.png' })
    await page.setViewportSize({ width: 390, height: 844 })

    await dialog.locator('[data-test=signout-everywhere-confirm]').click()
    await dialog.waitFor({ state: 'hidden' })
    await page.locator('[data-test=account-card]').getByRole('link', { name: 'Sign in' }).waitFor()
    expect((await other('GET', '/api/me')).status).toBe(401)
    await close()
  })
})
