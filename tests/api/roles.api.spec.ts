import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { demoAccounts } from '../../server/db/seed'
import { agentWithCsrf, makeTestApp, type TestApp } from '../helpers/testApp'

let t: TestApp
beforeAll(async () => { t = await makeTestApp() })
afterAll(async () => { await t.close() })

type Account = keyof typeof demoAccounts

async function signedIn(who: Account) {
  const a = await agentWithCsrf(t.app)
  const res = await a.signIn(demoAccounts[who].email, demoAccounts[who].password)
  expect(res.status).toBe(200)
  return a
}

const userOf = (who: Account) => t.deps.models.User.findOne({ where: { email: demoAccounts[who].email } })

describe('PATCH /api/person/preferences (person only)', () => {
  const body = { displayName: 'Robin A.' }

  it('returns 401 when nobody is signed in', async () => {
    const a = await agentWithCsrf(t.app)
    expect((await a.patch('/api/person/preferences', body)).status).toBe(401)
    expect((await userOf('person'))!.displayName).toBe(demoAccounts.person.displayName)
  })

  it.each(['therapist', 'admin'] as const)('returns 403 when a %s tries it', async (who) => {
    const a = await signedIn(who)
    const res = await a.patch('/api/person/preferences', body)
    expect(res.status).toBe(403)
    expect(res.body.error.code).toBe('forbidden')
    expect((await userOf(who))!.displayName).toBe(demoAccounts[who].displayName)
  })

  it('returns 200 and saves the change for the person', async () => {
    const a = await signedIn('person')
    const res = await a.patch('/api/person/preferences', { ...body, emailNotices: false })
    expect(res.status).toBe(200)
    expect(res.body.user).toMatchObject({ displayName: 'Robin A.', emailNotices: false })
    expect(await userOf('person')).toMatchObject({ displayName: 'Robin A.', emailNotices: false })
  })
})

describe('GET /api/therapist/profile (therapist only)', () => {
  it('returns 401 when nobody is signed in', async () => {
    const a = await agentWithCsrf(t.app)
    expect((await a.get('/api/therapist/profile')).status).toBe(401)
  })

  it.each(['person', 'admin'] as const)('returns 403 when a %s opens it', async (who) => {
    const a = await signedIn(who)
    const res = await a.get('/api/therapist/profile')
    expect(res.status).toBe(403)
    expect(res.body.error.code).toBe('forbidden')
  })

  it('returns 200 with the approval for an approved therapist', async () => {
    const a = await signedIn('therapist')
    const res = await a.get('/api/therapist/profile')
    expect(res.status).toBe(200)
    expect(res.body.profile.approval).toMatchObject({ approvedByName: demoAccounts.admin.displayName, checks: ['registration', 'identity', 'practice'] })
  })

  it('shows approval null to a therapist nobody has approved yet', async () => {
    const a = await signedIn('pendingTherapist')
    const res = await a.get('/api/therapist/profile')
    expect(res.status).toBe(200)
    expect(res.body.profile).toMatchObject({ registration: 'Psychotherapist, demo register no. FTR-31882', approval: null })
  })
})

describe('PATCH /api/therapist/profile', () => {
  const profileOf = async (who: Account) => t.deps.models.TherapistProfile.findOne({ where: { userId: (await userOf(who))!.id } })

  it('keeps the approval when the registration is sent back unchanged', async () => {
    const before = await profileOf('therapist')
    const a = await signedIn('therapist')
    const res = await a.patch('/api/therapist/profile', { registration: before!.registration })
    expect(res.status).toBe(200)
    expect(res.body.profile.approval).not.toBeNull()
    expect((await profileOf('therapist'))!.approvedAt).toEqual(before!.approvedAt)
  })

  it('clears the approval when an approved therapist changes their registration', async () => {
    expect((await profileOf('therapist'))!.approvedAt).toBeInstanceOf(Date)
    const a = await signedIn('therapist')
    const res = await a.patch('/api/therapist/profile', { registration: 'Counselling psychologist, demo register no. FTR-99999' })
    expect(res.status).toBe(200)
    expect(res.body.profile.approval).toBeNull()

    const profile = await profileOf('therapist')
    expect(profile).toMatchObject({ registration: 'Counselling psychologist, demo register no. FTR-99999', approvedAt: null, approvedById: null, approvalChecks: null })
    const therapist = await userOf('therapist')
    expect(await t.deps.models.AuditEvent.count({ where: { action: 'therapist.profile_changed', subjectUserId: therapist!.id } })).toBe(1)
  })
})

describe('GET /api/admin/accounts (admin only)', () => {
  it('returns 401 when nobody is signed in', async () => {
    const a = await agentWithCsrf(t.app)
    expect((await a.get('/api/admin/accounts')).status).toBe(401)
  })

  it.each(['person', 'therapist', 'pendingTherapist'] as const)('returns 403 when a %s opens it', async (who) => {
    const a = await signedIn(who)
    const res = await a.get('/api/admin/accounts')
    expect(res.status).toBe(403)
    expect(res.body.error.code).toBe('forbidden')
  })

  it('returns 200 with every account for the admin, without password hashes', async () => {
    const a = await signedIn('admin')
    const res = await a.get('/api/admin/accounts')
    expect(res.status).toBe(200)
    expect(res.body.accounts).toHaveLength(await t.deps.models.User.count())
    expect(res.body.accounts.map((r: { email: string }) => r.email)).toEqual(expect.arrayContaining(Object.values(demoAccounts).map((d) => d.email)))
    expect(JSON.stringify(res.body)).not.toContain('scrypt')
  })
})

describe('PATCH /api/therapist/preferences', () => {
  it('lets a therapist turn e-mail notices off, and refuses a person', async () => {
    const therapist = await agentWithCsrf(t.app)
    await therapist.signIn(demoAccounts.therapist.email, demoAccounts.therapist.password)
    const res = await therapist.patch('/api/therapist/preferences', { emailNotices: false })
    expect(res.status).toBe(200)
    expect(res.body.user.emailNotices).toBe(false)
    expect((await t.deps.models.User.findOne({ where: { email: demoAccounts.therapist.email } }))?.emailNotices).toBe(false)
    const person = await agentWithCsrf(t.app)
    await person.signIn(demoAccounts.person.email, demoAccounts.person.password)
    expect((await person.patch('/api/therapist/preferences', { emailNotices: false })).status).toBe(403)
  })
})
