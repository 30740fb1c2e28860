import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { demoAccounts } from '../../server/db/seed'
import { freshContext } from '../helpers/chromium'
import { signInThroughForm, startE2eServer } from '../helpers/e2eServer'

let server: Awaited<ReturnType<typeof startE2eServer>>
beforeAll(async () => { server = await startE2eServer() })
afterAll(async () => { await server?.close() })

describe('signing in, up and out in Chromium', () => {
  it('signs the demo person in, shows the account, and signs out keeping the journal note', async () => {
    const { context, close } = await freshContext()
    const page = await context.newPage()
    await signInThroughForm(page, server.url, demoAccounts.person.email, demoAccounts.person.password)
    expect(new URL(page.url()).pathname).toBe('/')
    await page.goto(server.url + '/more')
    await page.getByText(`Signed in as ${demoAccounts.person.displayName}`).waitFor()
    expect(await page.getByText('Signing out does not hide the journal on this device.').isVisible()).toBe(true)
    await page.getByRole('button', { name: 'Sign out', exact: true }).click()
    await page.getByRole('link', { name: 'Sign in' }).waitFor()
    await close()
  })

  it('shows one plain message for a wrong password', async () => {
    const { context, close } = await freshContext()
    const page = await context.newPage()
    await page.goto(server.url + '/signin')
    await page.getByLabel('E-mail').fill(demoAccounts.person.email)
    await page.getByLabel('Password').fill('not-the-password')
    await page.getByRole('button', { name: 'Sign in' }).click()
    const error = page.locator('[data-test=signin-error]')
    await error.waitFor()
    expect(await error.textContent()).toContain('do not match')
    expect(new URL(page.url()).pathname).toBe('/signin')
    await close()
  })

  it('creates an account, confirms it through the e-mailed link, and signs in', async () => {
    const { context, close } = await freshContext()
    const page = await context.newPage()
    await page.goto(server.url + '/signup')
    await page.getByLabel('A name for e-mails (a first name is fine)').fill('Kit')
    await page.getByLabel('E-mail', { exact: true }).fill('kit.e2e@example.org')
    await page.getByLabel('Password').fill('a walk by the river')
    await page.getByRole('button', { name: 'Create account' }).click()
    await page.locator('[data-test=signup-done]').waitFor()

    const mail = await server.deps.fakeSmtp!.waitFor((m) => m.to.includes('kit.e2e@example.org'))
    const link = mail.text.match(/http:\/\/\S+\/verify\?token=[A-Za-z0-9_-]{43}/)?.[0]
    expect(link, 'verification link in the mail').toBeTruthy()
    expect(link!.startsWith(server.url)).toBe(true)
    await page.goto(link!)
    const result = page.locator('[data-test=verify-result]')
    await result.waitFor()
    expect(await result.textContent()).toContain('confirmed')

    await signInThroughForm(page, server.url, 'kit.e2e@example.org', 'a walk by the river')
    const user = await server.deps.models.User.findOne({ where: { email: 'kit.e2e@example.org' } })
    expect(user?.emailVerifiedAt).toBeInstanceOf(Date)
    await close()
  })

  it('resets a forgotten password through the e-mailed link', async () => {
    const { context, close } = await freshContext()
    const page = await context.newPage()
    await page.goto(server.url + '/forgot')
    await page.getByLabel('E-mail').fill(demoAccounts.pendingTherapist.email)
    await page.getByRole('button', { name: 'Send the link' }).click()
    await page.locator('[data-test=forgot-done]').waitFor()
    const mail = await server.deps.fakeSmtp!.waitFor((m) => m.to.includes(demoAccounts.pendingTherapist.email) && m.subject === 'Choose a new password')
    const link = mail.text.match(/http:\/\/\S+\/reset\?token=[A-Za-z0-9_-]{43}/)?.[0]
    await page.goto(link!)
    await page.getByLabel('New password').fill('lantern by the door')
    await page.getByRole('button', { name: 'Save the new password' }).click()
    await page.locator('[data-test=reset-done]').waitFor()
    await signInThroughForm(page, server.url, demoAccounts.pendingTherapist.email, 'lantern by the door')
    expect(new URL(page.url()).pathname).toBe('/therapist/caseload')
    await page.goto(server.url + '/therapist/settings')
    await page.getByText('Waiting for approval').waitFor()
    await close()
  })

  it('lets the admin approve a therapist, recording what was checked', async () => {
    const { context, close } = await freshContext({ width: 1280, height: 800 })
    const page = await context.newPage()
    await signInThroughForm(page, server.url, demoAccounts.admin.email, demoAccounts.admin.password)
    await page.goto(server.url + '/admin/approvals')
    const card = page.locator('[data-test=pending-therapist]').filter({ hasText: demoAccounts.pendingTherapist.displayName })
    await card.waitFor()
    const approve = card.getByRole('button', { name: 'Approve' })
    expect(await approve.isDisabled()).toBe(true)
    await card.getByText('Registration found on the professional register').click()
    await approve.click()
    await page.locator('[data-test=no-pending]').waitFor()
    const user = await server.deps.models.User.findOne({ where: { email: demoAccounts.pendingTherapist.email }, include: [{ model: server.deps.models.TherapistProfile, as: 'therapistProfile' }] })
    expect(user?.therapistProfile?.approvedAt).toBeInstanceOf(Date)
    expect(JSON.parse(user!.therapistProfile!.approvalChecks!)).toEqual(['registration'])
    await close()
  })
})
