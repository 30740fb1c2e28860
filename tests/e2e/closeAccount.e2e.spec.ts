import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { demoAccounts } from '../../server/db/seed'
import { makePerson } from '../api/linkFixtures'
import { seriousViolations } from '../helpers/axe'
import { signInOverFetch } from '../helpers/apiSession'
import { freshContext } from '../helpers/chromium'
import { signInThroughForm, startE2eServer } from '../helpers/e2eServer'
import { saveMoment } from '../helpers/journalFlows'
import type { TestApp } from '../helpers/testApp'

let server: Awaited<ReturnType<typeof startE2eServer>>
beforeAll(async () => { server = await startE2eServer() })
afterAll(async () => { await server?.close() })

describe('closing an account in Chromium', () => {
  it('removes what the person shared from the server, ends the link, signs out and keeps the journal on the device', async () => {
    // makePerson needs only the models and the hash cost, which the running server has too.
    const account = await makePerson({ deps: server.deps } as unknown as TestApp, 'Marisol')
    const therapist = await signInOverFetch(server.url, demoAccounts.therapist)
    const person = await signInOverFetch(server.url, account)
    const invitation = await therapist('POST', '/api/therapist/invitations', {})
    const linked = await person('POST', '/api/person/links', { code: invitation.body.code })
    expect(linked.status).toBe(201)
    const linkId = String((linked.body.link as { id: string }).id)

    const { context, close } = await freshContext()
    const page = await context.newPage()
    await signInThroughForm(page, server.url, account.email, account.password)
    const text = 'Left the bike at the station and walked home slowly'
    await page.goto(server.url + '/')
    await saveMoment(page, text)
    await page.locator('[data-test=entry-card]').filter({ hasText: 'walked home' }).first().click()
    await page.waitForURL((u) => u.pathname.startsWith('/journal/'))
    await page.locator('[data-test=entry-share-open]').click()
    await page.locator('[data-test=share-confirm]').click()
    await page.locator('[data-test=share-state-shared]').waitFor({ timeout: 15_000 })
    const { SharedEntry, Link, User } = server.deps.models
    expect(await SharedEntry.count({ where: { linkId } })).toBe(1)

    await page.goto(server.url + '/more')
    await page.locator('[data-test=more-privacy]').click()
    await page.getByRole('heading', { name: 'Your data' }).waitFor()
    await page.locator('[data-test=privacy-close]').click()
    const dialog = page.locator('[data-test=close-account-dialog]')
    await dialog.waitFor()
    expect(await dialog.textContent()).toContain('The journal on this device stays')
    expect(await dialog.textContent()).toContain('already read or printed may be in their own records')
    expect(await seriousViolations(page), 'the close-account dialog').toEqual([])
    await page.screenshot({ path: '.screens/close-account-dialog-390.png' })

    // A wrong password is refused and nothing is removed.
    await page.locator('[data-test=close-account-password]').fill('not my password')
    await page.locator('[data-test=close-account-confirm]').click()
    await page.locator('[data-test=close-account-error]').getByText('not right').waitFor()
    expect(await SharedEntry.count({ where: { linkId } })).toBe(1)

    await page.locator('[data-test=close-account-password]').fill(account.password)
    await page.locator('[data-test=close-account-confirm]').click()
    await page.locator('[data-test=account-closed]').waitFor()

    expect(await SharedEntry.count({ where: { linkId } })).toBe(0)
    expect(await Link.findByPk(linkId)).toMatchObject({ state: 'ended', endedBy: account.user.id })
    expect(await User.count({ where: { email: account.email } })).toBe(0)
    const mail = await server.deps.fakeSmtp!.waitFor((m) => m.to.includes(demoAccounts.therapist.email) && m.subject === 'A linked account on Rungs was closed')
    expect(mail.text).not.toContain(text)

    // The device forgot the account and its link copies and queue, and kept the journal.
    const device = await page.evaluate(async () => {
      const db = await new Promise<IDBDatabase>((resolve, reject) => {
        const r = indexedDB.open('rungs')
        r.onsuccess = () => resolve(r.result)
        r.onerror = () => reject(r.error)
      })
      const count = (store: string) => new Promise<number>((resolve) => {
        const req = db.transaction(store).objectStore(store).count()
        req.onsuccess = () => resolve(req.result)
      })
      const signedInBefore = await new Promise<unknown>((resolve) => {
        const req = db.transaction('settings').objectStore('settings').get('signedInBefore')
        req.onsuccess = () => resolve(req.result)
      })
      const result = { links: await count('links'), outbox: await count('outbox'), entries: await count('entries'), signedInBefore }
      db.close()
      return result
    })
    expect(device).toEqual({ links: 0, outbox: 0, entries: 1, signedInBefore: undefined })
    await page.goto(server.url + '/more')
    await page.locator('[data-test=account-card]').getByRole('link', { name: 'Sign in' }).waitFor()
    await page.goto(server.url + '/journal')
    await page.getByText(text).first().waitFor()
    await close()
  })
})
