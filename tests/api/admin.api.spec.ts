import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { hashPassword } from '../../server/auth/password'
import { demoAccounts } from '../../server/db/seed'
import { agentWithCsrf, makeTestApp, type TestApp } from '../helpers/testApp'

let t: TestApp
let admin: Awaited<ReturnType<typeof agentWithCsrf>>
let adminId: string
let pendingId: string

beforeAll(async () => {
  t = await makeTestApp()
  admin = await agentWithCsrf(t.app)
  expect((await admin.signIn(demoAccounts.admin.email, demoAccounts.admin.password)).status).toBe(200)
  adminId = (await t.deps.models.User.findOne({ where: { email: demoAccounts.admin.email } }))!.id
  pendingId = (await t.deps.models.User.findOne({ where: { email: demoAccounts.pendingTherapist.email } }))!.id
})
afterAll(async () => { await t.close() })

const pendingProfile = () => t.deps.models.TherapistProfile.findOne({ where: { userId: pendingId } })
const pendingEmails = async () => ((await admin.get('/api/admin/approvals')).body.pending as { email: string }[]).map((r) => r.email)

async function pendingTherapistMe() {
  const a = await agentWithCsrf(t.app)
  await a.signIn(demoAccounts.pendingTherapist.email, demoAccounts.pendingTherapist.password)
  return (await a.get('/api/me')).body.user
}

describe('therapist approvals', () => {
  it('lists the demo therapist who is waiting for approval, and not the approved one', async () => {
    const res = await admin.get('/api/admin/approvals')
    expect(res.status).toBe(200)
    const emails = res.body.pending.map((r: { email: string }) => r.email)
    expect(emails).toContain(demoAccounts.pendingTherapist.email)
    expect(emails).not.toContain(demoAccounts.therapist.email)
  })

  it('returns 400 when the admin records no checks, and approves nothing', async () => {
    const res = await admin.post(`/api/admin/approvals/${pendingId}`, { checks: [] })
    expect(res.status).toBe(400)
    expect(res.body.error.code).toBe('invalid_input')
    expect((await pendingProfile())!.approvedAt).toBeNull()
  })

  it('records who approved, when, what was checked and why, and writes an audit event', async () => {
    const note = 'Found on the demo register.'
    const res = await admin.post(`/api/admin/approvals/${pendingId}`, { checks: ['registration', 'identity'], note })
    expect(res.status).toBe(200)

    const profile = await pendingProfile()
    expect(profile!.approvedAt).toBeInstanceOf(Date)
    expect(profile!.approvedById).toBe(adminId)
    expect(JSON.parse(profile!.approvalChecks!)).toEqual(['registration', 'identity'])
    expect(profile!.approvalNote).toBe(note)
    const audit = await t.deps.models.AuditEvent.findAll({ where: { action: 'therapist.approved', subjectUserId: pendingId } })
    expect(audit).toHaveLength(1)
    expect(audit[0]!.actorId).toBe(adminId)
    expect(await pendingEmails()).not.toContain(demoAccounts.pendingTherapist.email)
  })

  it('shows the therapist the checks and the approving admin in GET /api/me', async () => {
    const me = await pendingTherapistMe()
    expect(me.therapist.approval).toMatchObject({ checks: ['registration', 'identity'], approvedByName: demoAccounts.admin.displayName, note: 'Found on the demo register.' })
  })

  it('clears the approval when the admin revokes it', async () => {
    const res = await admin.del(`/api/admin/approvals/${pendingId}`)
    expect(res.status).toBe(200)
    expect(await pendingProfile()).toMatchObject({ approvedAt: null, approvedById: null, approvalChecks: null, approvalNote: null })
    expect(await t.deps.models.AuditEvent.count({ where: { action: 'therapist.approval_revoked', subjectUserId: pendingId } })).toBe(1)
    expect((await pendingTherapistMe()).therapist.approval).toBeNull()
    expect(await pendingEmails()).toContain(demoAccounts.pendingTherapist.email)
  })
})

describe('PATCH /api/admin/accounts/:id', () => {
  it('disables an account, deletes its sessions, signs it out and writes an audit event', async () => {
    const password = 'a long enough passphrase'
    const user = await t.deps.models.User.create({
      email: 'admin-disable@example.test', passwordHash: await hashPassword(password, t.deps.config.scryptCost), role: 'person', displayName: 'Soon Disabled', emailVerifiedAt: new Date(), disabledAt: null,
    })
    const victim = await agentWithCsrf(t.app)
    await victim.signIn(user.email, password)
    expect(await t.deps.models.Session.count({ where: { userId: user.id } })).toBe(1)

    const res = await admin.patch(`/api/admin/accounts/${user.id}`, { disabled: true })
    expect(res.status).toBe(200)
    expect(res.body.account).toMatchObject({ id: user.id, disabled: true })
    await user.reload()
    expect(user.disabledAt).toBeInstanceOf(Date)
    expect(await t.deps.models.Session.count({ where: { userId: user.id } })).toBe(0)
    expect(await t.deps.models.AuditEvent.count({ where: { action: 'account.disabled', subjectUserId: user.id, actorId: adminId } })).toBe(1)
    expect((await victim.get('/api/me')).status).toBe(401)
  })

  it('returns 400 when an admin tries to disable their own account', async () => {
    const res = await admin.patch(`/api/admin/accounts/${adminId}`, { disabled: true })
    expect(res.status).toBe(400)
    expect(res.body.error.code).toBe('self')
    expect((await t.deps.models.User.findByPk(adminId))!.disabledAt).toBeNull()
    expect(await t.deps.models.AuditEvent.count({ where: { subjectUserId: adminId } })).toBe(0)
    expect((await admin.get('/api/admin/accounts')).status).toBe(200)
  })

  it.each([
    ['PATCH', '/api/admin/accounts/not-a-uuid'],
    ['POST', '/api/admin/approvals/123'],
    ['DELETE', '/api/admin/approvals/123'],
  ])('returns 400, not 500, for %s %s', async (method, url) => {
    const res = method === 'PATCH' ? await admin.patch(url, { disabled: true }) : method === 'POST' ? await admin.post(url, { checks: ['identity'] }) : await admin.del(url)
    expect(res.status).toBe(400)
    expect(res.body.error.code).toBe('invalid_input')
    expect(res.body.error.details[0].path).toEqual(['params', 'id'])
  })

  it('returns 404 for a well-formed id that names no account', async () => {
    const res = await admin.patch('/api/admin/accounts/6f1c2a3b-4d5e-4f60-8a7b-9c0d1e2f3a4b', { disabled: true })
    expect(res.status).toBe(404)
    expect(res.body.error.code).toBe('not_found')
  })
})

describe('GET /api/admin/mail', () => {
  it('lists mail the fake SMTP server received and returns one message with its text', async () => {
    const email = 'admin-mail-reader@example.test'
    const visitor = await agentWithCsrf(t.app)
    expect((await visitor.post('/api/auth/signup', { role: 'person', email, password: 'a long enough passphrase', displayName: 'Reader' })).status).toBe(202)
    expect(await t.deps.models.User.count({ where: { email } })).toBe(1)
    await t.deps.fakeSmtp.waitFor((m) => m.to.includes(email))

    const list = await admin.get('/api/admin/mail')
    expect(list.status).toBe(200)
    const summary = list.body.messages.find((m: { to: string }) => m.to.includes(email))
    expect(summary).toMatchObject({ id: expect.any(String), subject: 'Confirm your e-mail address', receivedAt: expect.any(String) })
    expect(summary).not.toHaveProperty('text')

    const one = await admin.get(`/api/admin/mail/${summary.id}`)
    expect(one.status).toBe(200)
    expect(one.body.message.text).toContain('http://localhost:3000/verify?token=')
  })

  it('returns 400 for a message id that is not a uuid', async () => {
    const res = await admin.get('/api/admin/mail/nope')
    expect(res.status).toBe(400)
    expect(res.body.error.code).toBe('invalid_input')
  })

  it('returns 403 when a person opens the list or a message', async () => {
    const a = await agentWithCsrf(t.app)
    await a.signIn(demoAccounts.person.email, demoAccounts.person.password)
    const id = t.deps.fakeSmtp.messages()[0]!.id
    for (const url of ['/api/admin/mail', `/api/admin/mail/${id}`]) {
      const res = await a.get(url)
      expect(res.status).toBe(403)
      expect(res.body.error.code).toBe('forbidden')
    }
  })
})
