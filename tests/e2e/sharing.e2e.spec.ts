import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { demoAccounts } from '../../server/db/seed'
import { freshContext } from '../helpers/chromium'
import { signInThroughForm, startE2eServer } from '../helpers/e2eServer'
import { saveMoment } from '../helpers/journalFlows'
import { seriousViolations } from '../helpers/axe'
import { signInOverFetch } from '../helpers/apiSession'

let server: Awaited<ReturnType<typeof startE2eServer>>
beforeAll(async () => { server = await startE2eServer() })
afterAll(async () => { await server?.close() })

describe('sharing an entry with a linked therapist in Chromium', () => {
  it('waits to send while offline, sends when back online, shows who opened it, and withdraws', async () => {
    const { context, close } = await freshContext()
    const page = await context.newPage()
    await signInThroughForm(page, server.url, demoAccounts.person.email, demoAccounts.person.password)

    await page.goto(server.url + '/more/share')
    await page.locator('[data-test=share-caution]').first().waitFor()
    const linkCard = page.locator('[data-test^="link-"]').filter({ hasText: demoAccounts.therapist.displayName }).first()
    await linkCard.waitFor()
    expect(await linkCard.locator('[data-test=link-state]').textContent()).toContain('Active')
    expect(await seriousViolations(page)).toEqual([])

    const text = 'Sat with the tea going cold and noticed my shoulders'
    await page.goto(server.url + '/')
    await saveMoment(page, text)
    await page.locator('[data-test=entry-card]').filter({ hasText: 'shoulders' }).first().click()
    await page.waitForURL((u) => u.pathname.startsWith('/journal/'))
    const entryId = new URL(page.url()).pathname.split('/').pop()!
    await page.locator('[data-test=share-state-private]').waitFor()

    await context.setOffline(true)
    await page.locator('[data-test=entry-share-open]').click()
    const preview = page.locator('[data-test=share-preview]')
    await preview.waitFor()
    expect(await preview.textContent()).toContain(text)
    expect(await preview.locator('[data-test=share-caution]').textContent()).toContain('not watching Rungs in real time')
    expect(await preview.locator('[data-test=share-risk-flag]').count()).toBe(0)
    expect(await seriousViolations(page)).toEqual([])
    await page.locator('[data-test=share-confirm]').click()
    await page.locator('[data-test=share-state-queued]').waitFor()
    expect(await page.getByText('Waiting to send').first().isVisible()).toBe(true)

    await context.setOffline(false)
    await page.locator('[data-test=share-state-shared]').waitFor({ timeout: 15_000 })

    const therapist = await signInOverFetch(server.url, demoAccounts.therapist)
    const links = (await therapist('GET', '/api/therapist/links')).body.links as { id: string; state: string; person: { displayName: string } }[]
    const link = links.find((l) => l.person.displayName === demoAccounts.person.displayName && l.state === 'active')!
    expect(link).toBeDefined()
    const shared = (await therapist('GET', `/api/therapist/links/${link.id}/shares`)).body.shares as { entryId: string; payload: { body: string; shares: unknown[] } }[]
    const copy = shared.find((s) => s.entryId === entryId)
    expect(copy?.payload.body).toBe(text)
    expect(copy?.payload.shares).toEqual([])

    // The therapist's read is in the person's access log, named by the entry on the device.
    await page.goto(server.url + '/more/share')
    const card = page.locator(`[data-test="link-${link.id}"]`)
    await card.getByText('Who opened what').click()
    await card.locator('[data-test=link-access-log]').getByText(/opened Moment of/).first().waitFor()

    await page.goBack()
    await page.locator('[data-test=entry-share-withdraw]').click()
    await page.getByText('What they already read or printed may be in their own records.').waitFor()
    expect(await seriousViolations(page)).toEqual([])
    await page.getByRole('button', { name: 'Withdraw' }).last().click()
    await page.locator('[data-test=share-state-withdrawn]').waitFor({ timeout: 15_000 })
    const after = (await therapist('GET', `/api/therapist/links/${link.id}/shares`)).body.shares as { entryId: string }[]
    expect(after.some((s) => s.entryId === entryId)).toBe(false)
    await close()
  })

  it('says in the preview that an entry with risk language will carry a flag, and the therapist receives it flagged', async () => {
    const { context, close } = await freshContext()
    const page = await context.newPage()
    await signInThroughForm(page, server.url, demoAccounts.person.email, demoAccounts.person.password)
    await page.goto(server.url + '/')
    await saveMoment(page, 'Some nights I want to die and the rain does not help')
    await page.locator('[data-test=entry-card]').filter({ hasText: 'rain does not help' }).first().click()
    await page.waitForURL((u) => u.pathname.startsWith('/journal/'))
    const entryId = new URL(page.url()).pathname.split('/').pop()!

    await page.locator('[data-test=entry-share-open]').click()
    const flag = page.locator('[data-test=share-preview] [data-test=share-risk-flag]')
    await flag.waitFor()
    expect(await flag.textContent()).toContain('will carry a flag')
    await page.locator('[data-test=share-confirm]').click()
    await page.locator('[data-test=share-state-shared]').waitFor({ timeout: 15_000 })

    const therapist = await signInOverFetch(server.url, demoAccounts.therapist)
    const links = (await therapist('GET', '/api/therapist/links')).body.links as { id: string; state: string }[]
    const link = links.find((l) => l.state === 'active')!
    const shared = (await therapist('GET', `/api/therapist/links/${link.id}/shares`)).body.shares as { entryId: string; riskFlag: boolean }[]
    expect(shared.find((s) => s.entryId === entryId)?.riskFlag).toBe(true)
    await close()
  })

  // Last in the file: it ends the demo link the tests above use.
  it('ends the link after saying what the therapist may keep, and the therapist no longer sees the shared copies', async () => {
    const { context, close } = await freshContext()
    const page = await context.newPage()
    await signInThroughForm(page, server.url, demoAccounts.person.email, demoAccounts.person.password)
    await page.goto(server.url + '/more/share')
    const card = page.locator('[data-test^="link-"]').filter({ hasText: demoAccounts.therapist.displayName }).first()
    await card.locator('[data-test=link-end]').click()
    await page.getByText('What they already read or printed may be in their own records.').waitFor()
    await page.getByRole('button', { name: 'End link' }).last().click()
    await card.locator('[data-test=link-state]').filter({ hasText: 'Ended' }).waitFor()
    expect(await card.locator('[data-test=link-end]').count()).toBe(0)

    const therapist = await signInOverFetch(server.url, demoAccounts.therapist)
    const links = (await therapist('GET', '/api/therapist/links')).body.links as { id: string; state: string }[]
    expect(links.every((l) => l.state === 'ended')).toBe(true)
    const shared = await therapist('GET', `/api/therapist/links/${links[0]!.id}/shares`)
    // An ended link either answers with no live copies or not at all; either way the earlier shares are gone.
    if (shared.status === 200) expect(shared.body.shares).toEqual([])
    else expect(shared.status).toBe(404)
    await close()
  })
})
