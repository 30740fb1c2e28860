import { randomUUID } from 'node:crypto'
import { Op } from 'sequelize'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { staffCloseMessage } from '../../shared/schemas/privacy.schema'
import { issueToken } from '../../server/modules/auth/tokens'
import { makeTestApp, type TestApp } from '../helpers/testApp'
import { agentWithCsrf } from '../helpers/testApp'
import { linkUp, makePerson, makeTherapist, put, signedInAs, type Agent } from './linkFixtures'

let t: TestApp
beforeAll(async () => { t = await makeTestApp() })
afterAll(async () => { await t.close() })

const NOTE = 'prep-note-about-the-heron-bridge'

/** A person linked with a therapist, with one live shared copy, one tombstone, an earlier score, an appointment and a note. */
async function linkedPerson(name: string, marker: string) {
  const therapistAccount = await makeTherapist(t, `Dr ${name} Ashby`)
  const personAccount = await makePerson(t, name)
  const therapist = await signedInAs(t, therapistAccount)
  const person = await signedInAs(t, personAccount)
  const linkId = await linkUp(therapist, person)
  const live = randomUUID()
  const gone = randomUUID()
  expect((await put(person, linkId, live, 1, marker)).status).toBe(200)
  expect((await put(person, linkId, gone, 1, `${marker}-withdrawn`)).status).toBe(200)
  expect((await person.del(`/api/links/${linkId}/shares/${gone}?version=1`)).status).toBe(200)
  // The therapist opens the shares once, so the person's access log has a row.
  expect((await therapist.get(`/api/therapist/links/${linkId}/shares`)).status).toBe(200)
  expect((await therapist.post(`/api/therapist/links/${linkId}/notes`, { text: NOTE })).status).toBe(201)
  expect((await therapist.post(`/api/therapist/links/${linkId}/appointments`, { at: new Date(Date.now() + 86_400_000).toISOString() })).status).toBe(201)
  const earlier = await therapist.agent
    .post(`/api/therapist/links/${linkId}/earlier-scores`)
    .set('x-csrf-token', therapist.token)
    .attach('file', Buffer.from('date,measure,total\n2026-02-11,PHQ-9,23\n'), { filename: 'earlier.csv', contentType: 'text/csv' })
  expect(earlier.status).toBe(201)
  return { therapistAccount, personAccount, therapist, person, linkId, live, gone }
}

async function countsFor(userId: string, linkId: string) {
  const m = t.deps.models
  return {
    shares: await m.SharedEntry.count({ where: { linkId } }),
    earlier: await m.EarlierScore.count({ where: { linkId } }),
    appointments: await m.Appointment.count({ where: { linkId } }),
    sessions: await m.Session.count({ where: { userId } }),
    tokens: await m.EmailToken.count({ where: { userId } }),
  }
}

describe('GET /api/me/export', () => {
  it('downloads the account, links, appointments, shared copies, earlier scores and events as a dated JSON attachment', async () => {
    const s = await linkedPerson('Rowan', 'juniper-lantern')
    const res = await s.person.get('/api/me/export')
    expect(res.status).toBe(200)
    expect(res.headers['content-type']).toMatch(/^application\/json/)
    expect(res.headers['content-disposition']).toMatch(/^attachment; filename="?rungs-account-\d{4}-\d{2}-\d{2}\.json"?$/)
    expect(res.headers['cache-control']).toBe('no-store')
    const data = JSON.parse(res.text)

    expect(data.account).toMatchObject({ email: s.personAccount.email, displayName: 'Rowan', role: 'person', preferences: { emailNotices: true } })
    expect(data.account.emailVerifiedAt).toMatch(/^\d{4}-/)
    expect(data.account.createdAt).toMatch(/^\d{4}-/)
    expect(data.links).toEqual([
      expect.objectContaining({ id: s.linkId, state: 'active', endedAt: null, therapist: { displayName: 'Dr Rowan Ashby', practice: 'Brookvale Rooms (invented)' } }),
    ])
    expect(data.appointments).toHaveLength(1)
    expect(data.appointments[0].linkId).toBe(s.linkId)
    const live = data.sharedCopies.find((c: { entryId: string }) => c.entryId === s.live)
    expect(live).toMatchObject({ version: 1, toDiscuss: false, riskFlag: false, withdrawnAt: null, payload: { body: 'juniper-lantern body' } })
    expect(live.sharedAt).toMatch(/^\d{4}-/)
    const gone = data.sharedCopies.find((c: { entryId: string }) => c.entryId === s.gone)
    expect(gone.payload).toBeNull()
    expect(gone.withdrawnAt).toMatch(/^\d{4}-/)
    expect(data.earlierScores).toEqual([expect.objectContaining({ instrument: 'phq9', takenOn: '2026-02-11', total: 23 })])
    const actions = data.auditEvents.map((e: { action: string }) => e.action)
    expect(actions).toEqual(expect.arrayContaining(['link.started', 'shares.read', 'earlierScores.uploaded', 'account.exported']))
    expect(data.auditEvents.find((e: { action: string }) => e.action === 'shares.read')).toMatchObject({ by: 'your therapist', entryId: s.live })
    expect(data.readme).toMatch(/prep notes/)
    expect(data.readme).toMatch(/therapist's own working notes/)

    // The access log of the download itself.
    expect(await t.deps.models.AuditEvent.count({ where: { action: 'account.exported', subjectUserId: s.personAccount.user.id } })).toBe(1)
  })

  it('leaves out password hashes, session ids, tokens, invitation hashes, prep notes and other people\'s ids', async () => {
    const s = await linkedPerson('Indigo', 'quiet-harbour')
    await issueToken(t.deps.models, s.personAccount.user.id, 'reset')
    const res = await s.person.get('/api/me/export')
    expect(res.status).toBe(200)
    const text = res.text
    const user = await t.deps.models.User.findByPk(s.personAccount.user.id)
    const sessions = await t.deps.models.Session.findAll({ where: { userId: user!.id } })
    const tokens = await t.deps.models.EmailToken.findAll({ where: { userId: user!.id } })
    const invitations = await t.deps.models.Invitation.findAll({ where: { therapistId: s.therapistAccount.user.id } })
    expect(sessions.length).toBeGreaterThan(0)
    expect(tokens.length).toBeGreaterThan(0)
    for (const word of ['passwordHash', 'sid', 'tokenHash', 'codeHash', 'scrypt$']) expect(text).not.toContain(word)
    expect(text).not.toContain(user!.passwordHash)
    for (const row of sessions) expect(text).not.toContain(row.sid)
    for (const row of tokens) expect(text).not.toContain(row.tokenHash)
    for (const row of invitations) expect(text).not.toContain(row.codeHash)
    expect(text).not.toContain(NOTE)
    expect(text).not.toContain(s.therapistAccount.user.id)
    expect(text).not.toContain(s.therapistAccount.email)
  })

  it('answers 401 signed out and 403 for a therapist, and writes no export row', async () => {
    const before = await t.deps.models.AuditEvent.count({ where: { action: 'account.exported' } })
    const anonymous = await agentWithCsrf(t.app)
    expect((await anonymous.get('/api/me/export')).status).toBe(401)
    const therapist = await signedInAs(t, await makeTherapist(t, 'Wren Export'))
    const res = await therapist.get('/api/me/export')
    expect(res.status).toBe(403)
    expect(res.body.error.code).toBe('forbidden')
    expect(await t.deps.models.AuditEvent.count({ where: { action: 'account.exported' } })).toBe(before)
  })
})

describe('DELETE /api/me', () => {
  it('refuses a wrong password with a generic 403 and removes nothing', async () => {
    const s = await linkedPerson('Sorrel', 'amber-thistle')
    await issueToken(t.deps.models, s.personAccount.user.id, 'reset')
    const before = await countsFor(s.personAccount.user.id, s.linkId)
    const res = await s.person.agent.delete('/api/me').set('x-csrf-token', s.person.token).send({ password: 'not-the-password' })
    expect(res.status).toBe(403)
    expect(res.body.error).toEqual({ code: 'wrong_password', message: 'That password is not right. Nothing was changed.' })
    expect(await countsFor(s.personAccount.user.id, s.linkId)).toEqual(before)
    expect(before).toMatchObject({ shares: 2, earlier: 1, appointments: 1, tokens: 1 })
    const user = await t.deps.models.User.findByPk(s.personAccount.user.id)
    expect(user).toMatchObject({ email: s.personAccount.email, displayName: 'Sorrel', disabledAt: null })
    expect((await t.deps.models.Link.findByPk(s.linkId))!.state).toBe('active')
    // Still signed in.
    expect((await s.person.get('/api/me')).status).toBe(200)
  })

  it('answers 400 without a password and changes nothing', async () => {
    const s = await linkedPerson('Tansy', 'plain-kettle')
    const before = await countsFor(s.personAccount.user.id, s.linkId)
    const res = await s.person.agent.delete('/api/me').set('x-csrf-token', s.person.token).send({})
    expect(res.status).toBe(400)
    expect(await countsFor(s.personAccount.user.id, s.linkId)).toEqual(before)
  })

  it('refuses a therapist and an admin with a clear message, even with the right password', async () => {
    const account = await makeTherapist(t, 'Hazel Staff')
    const therapist = await signedInAs(t, account)
    const res = await therapist.agent.delete('/api/me').set('x-csrf-token', therapist.token).send({ password: account.password })
    expect(res.status).toBe(403)
    expect(res.body.error).toEqual({ code: 'forbidden', message: staffCloseMessage })
    expect(await t.deps.models.User.findByPk(account.user.id)).toMatchObject({ email: account.email, disabledAt: null })
    expect((await therapist.get('/api/me')).status).toBe(200)

    const adminUser = await t.deps.models.User.findOne({ where: { role: 'admin' } })
    const admin = await signedInAs(t, { email: adminUser!.email, password: (await import('../../server/db/seed')).demoAccounts.admin.password })
    const adminRes = await admin.agent.delete('/api/me').set('x-csrf-token', admin.token).send({ password: 'whatever-it-is' })
    expect(adminRes.status).toBe(403)
    expect(adminRes.body.error.message).toMatch(/admin/)
    expect((await t.deps.models.User.findByPk(adminUser!.id))!.disabledAt).toBeNull()
  })

  it('removes every shared row, earlier score, appointment, session and token, ends the links and tells the therapist without content', async () => {
    const marker = 'saffron-weathervane'
    const s = await linkedPerson('Linden', marker)
    const userId = s.personAccount.user.id
    await issueToken(t.deps.models, userId, 'reset')
    // A second device signed in as the same person: its session must go too.
    const otherDevice = await signedInAs(t, s.personAccount)
    // Someone else's link and copy, which must stay as they are.
    const bystander = await linkedPerson('Bystander', 'bystander-text')
    const bystanderBefore = await countsFor(bystander.personAccount.user.id, bystander.linkId)
    // An invitation the therapist e-mailed to the person's address.
    const invited = await s.therapist.post('/api/therapist/invitations', { email: s.personAccount.email })
    expect(invited.status).toBe(201)

    const before = await countsFor(userId, s.linkId)
    expect(before).toMatchObject({ shares: 2, earlier: 1, appointments: 1, tokens: 1 })
    expect(before.sessions).toBeGreaterThanOrEqual(2)

    const res = await s.person.agent.delete('/api/me').set('x-csrf-token', s.person.token).send({ password: s.personAccount.password })
    expect(res.status).toBe(200)
    expect(await countsFor(userId, s.linkId)).toEqual({ shares: 0, earlier: 0, appointments: 0, sessions: 0, tokens: 0 })
    // Payloads AND tombstones: no row is left for either entry, on any link.
    expect(await t.deps.models.SharedEntry.count({ where: { entryId: { [Op.in]: [s.live, s.gone] } } })).toBe(0)

    const link = await t.deps.models.Link.findByPk(s.linkId)
    expect(link).toMatchObject({ state: 'ended', endedBy: userId })
    expect(link!.endedAt).toBeInstanceOf(Date)
    expect(await t.deps.models.Link.count({ where: { personId: userId, state: { [Op.ne]: 'ended' } } })).toBe(0)

    // The user row is a tombstone: same id, nothing that identifies the person, no usable password.
    const user = await t.deps.models.User.findByPk(userId)
    expect(user!.email).not.toBe(s.personAccount.email)
    expect(user!.email).toMatch(/@closed\.invalid$/)
    expect(user!.displayName).toBe('Closed account')
    expect(user!.passwordHash.startsWith('scrypt$')).toBe(false)
    expect(user!.disabledAt).toBeInstanceOf(Date)
    expect(await t.deps.models.User.count({ where: { email: s.personAccount.email } })).toBe(0)
    expect((await t.deps.models.Invitation.findByPk(invited.body.invitation.id))!.email).toBeNull()
    // Audit rows stay, pointing at the tombstone, with no content.
    const events = await t.deps.models.AuditEvent.findAll({ where: { subjectUserId: userId } })
    expect(events.map((e) => e.action)).toContain('account.closed')
    expect(JSON.stringify(events.map((e) => e.toJSON()))).not.toContain(marker)
    // The therapist's own prep note outlives the link, as it does when a link ends.
    expect(await t.deps.models.PrepNote.count({ where: { linkId: s.linkId } })).toBe(1)

    // Signed out here and on the other device; the old password no longer signs in.
    expect((await s.person.get('/api/me')).status).toBe(401)
    expect((await otherDevice.get('/api/me')).status).toBe(401)
    const again = await agentWithCsrf(t.app)
    expect((await again.signIn(s.personAccount.email, s.personAccount.password)).status).toBe(401)
    // The therapist no longer reaches anything over the link.
    expect((await s.therapist.get(`/api/therapist/links/${s.linkId}/shares`)).status).toBe(404)

    // The notice: to the therapist, discreet subject, no entry text, no score.
    const mail = await t.deps.fakeSmtp.waitFor((m) => m.to.includes(s.therapistAccount.email) && m.subject === 'A linked account on Rungs was closed')
    expect(mail.subject).not.toMatch(/therap/i)
    expect(mail.text).toContain('Linden')
    expect(mail.text).toMatch(/closed their account/)
    expect(mail.text).toMatch(/removed/)
    expect(mail.text).not.toContain(marker)
    expect(mail.text).not.toMatch(/\b23\b/)
    expect(mail.text).not.toMatch(/therap/i)

    expect(await countsFor(bystander.personAccount.user.id, bystander.linkId)).toEqual(bystanderBefore)
    expect((await t.deps.models.Link.findByPk(bystander.linkId))!.state).toBe('active')
  })

  it('sends the notice even to a therapist who turned notices off', async () => {
    const s = await linkedPerson('Yarrow', 'lichen-gate')
    await t.deps.models.User.update({ emailNotices: false }, { where: { id: s.therapistAccount.user.id } })
    const res = await s.person.agent.delete('/api/me').set('x-csrf-token', s.person.token).send({ password: s.personAccount.password })
    expect(res.status).toBe(200)
    const mail = await t.deps.fakeSmtp.waitFor((m) => m.to.includes(s.therapistAccount.email) && m.subject === 'A linked account on Rungs was closed')
    expect(mail.text).toContain('Yarrow')
    expect(mail.text).not.toContain('lichen-gate')
  })

  it('lets the same address make a new account afterwards', async () => {
    const p = await makePerson(t, 'Fennel')
    const person: Agent = await signedInAs(t, p)
    expect((await person.agent.delete('/api/me').set('x-csrf-token', person.token).send({ password: p.password })).status).toBe(200)
    const fresh = await agentWithCsrf(t.app)
    const res = await fresh.post('/api/auth/signup', { role: 'person', email: p.email, password: 'a-brand-new-meadow', displayName: 'Fennel again' })
    expect(res.status).toBe(202)
    expect(await t.deps.models.User.count({ where: { email: p.email } })).toBe(1)
  })
})
