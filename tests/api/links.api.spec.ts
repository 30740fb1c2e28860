import { randomUUID } from 'node:crypto'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { notWatchedCaution } from '../../shared/schemas/link.schema'
import { demoAccounts } from '../../server/db/seed'
import { hashInviteCode } from '../../server/modules/links/inviteCode'
import { makeTestApp, type TestApp } from '../helpers/testApp'
import { demo, linkUp, makePerson, makeTherapist, put, signedInAs } from './linkFixtures'

let t: TestApp
beforeAll(async () => { t = await makeTestApp() })
afterAll(async () => { await t.close() })

const bare = (code: string) => code.replace('-', '')

describe('POST /api/therapist/invitations', () => {
  it('returns a XXXX-XXXX code, stores only its hash, and lists it without the code', async () => {
    const a = await demo(t, 'therapist')
    const res = await a.post('/api/therapist/invitations', {})
    expect(res.status).toBe(201)
    expect(res.body.code).toMatch(/^[ABCDEFGHJKMNPQRSTUVWXYZ23456789]{4}-[ABCDEFGHJKMNPQRSTUVWXYZ23456789]{4}$/)
    const row = await t.deps.models.Invitation.findByPk(res.body.invitation.id)
    expect(row!.codeHash).toBe(hashInviteCode(bare(res.body.code)))
    expect(JSON.stringify(row!.toJSON())).not.toContain(bare(res.body.code))
    const days = (row!.expiresAt.getTime() - Date.now()) / 86_400_000
    expect(days).toBeGreaterThan(6.9)
    expect(days).toBeLessThanOrEqual(7)

    const list = await a.get('/api/therapist/invitations')
    expect(list.status).toBe(200)
    expect(list.body.invitations.map((i: { id: string }) => i.id)).toContain(row!.id)
    expect(JSON.stringify(list.body)).not.toContain(bare(res.body.code))
  })

  it('e-mails the code discreetly when an address is given', async () => {
    const a = await demo(t, 'therapist')
    const res = await a.post('/api/therapist/invitations', { email: 'Someone.New@Example.org' })
    expect(res.status).toBe(201)
    expect((await t.deps.models.Invitation.findByPk(res.body.invitation.id))!.email).toBe('someone.new@example.org')
    const mail = await t.deps.fakeSmtp.waitFor((m) => m.to.includes('someone.new@example.org'))
    expect(mail.subject).toBe('An invitation to connect on Rungs')
    expect(mail.subject).not.toMatch(/therap/i)
    expect(mail.text).toContain(res.body.code)
    expect(mail.text).toContain('http://localhost:3000')
    expect(mail.text).not.toMatch(/therap/i)
  })

  it('returns 403 not_approved for a therapist nobody has approved and stores nothing', async () => {
    const a = await demo(t, 'pendingTherapist')
    const before = await t.deps.models.Invitation.count()
    const res = await a.post('/api/therapist/invitations', {})
    expect(res.status).toBe(403)
    expect(res.body.error.code).toBe('not_approved')
    expect(await t.deps.models.Invitation.count()).toBe(before)
  })
})

describe('preview and confirm', () => {
  it('previews the therapist with the approval and the caution, then confirms an active link', async () => {
    const therapist = await demo(t, 'therapist')
    const p = await makePerson(t, 'Sky')
    const person = await signedInAs(t, p)
    const { body: inv } = await therapist.post('/api/therapist/invitations', {})

    const preview = await person.post('/api/person/links/preview', { code: inv.code.toLowerCase() })
    expect(preview.status).toBe(200)
    expect(preview.body.preview).toMatchObject({
      therapist: { displayName: demoAccounts.therapist.displayName, approval: { approvedByName: demoAccounts.admin.displayName, checks: ['registration', 'identity', 'practice'] } },
      caution: notWatchedCaution,
    })
    expect(preview.body.preview.therapist.registration).toContain('FTR-20417')
    // The preview records a pending link; the code stays unused until the person confirms.
    const pending = await t.deps.models.Link.findAll({ where: { personId: p.user.id } })
    expect(pending.map((l) => l.state)).toEqual(['pending'])
    expect(pending[0]!.startedAt).toBeNull()
    expect((await t.deps.models.Invitation.findByPk(inv.invitation.id))!.usedAt).toBeNull()
    // Nothing can be shared over a pending link.
    expect((await put(person, pending[0]!.id, randomUUID(), 1, 'too early')).status).toBe(409)

    const res = await person.post('/api/person/links', { code: inv.code })
    expect(res.status).toBe(201)
    expect(res.body.link).toMatchObject({ state: 'active', endedAt: null, therapist: { displayName: demoAccounts.therapist.displayName } })
    const link = await t.deps.models.Link.findByPk(res.body.link.id)
    expect(link).toMatchObject({ personId: p.user.id, state: 'active', endedAt: null })
    expect(link!.id).toBe(pending[0]!.id)
    expect(await t.deps.models.Link.count({ where: { personId: p.user.id } })).toBe(1)
    expect(link!.startedAt).toBeInstanceOf(Date)
    expect((await t.deps.models.Invitation.findByPk(inv.invitation.id))!.usedAt).toBeInstanceOf(Date)
    expect(await t.deps.models.AuditEvent.count({ where: { action: 'link.started', subjectId: link!.id } })).toBe(1)

    // Notices to both sides, without a word of therapy in the subject.
    const toPerson = await t.deps.fakeSmtp.waitFor((m) => m.to.includes(p.email))
    const toTherapist = await t.deps.fakeSmtp.waitFor((m) => m.to.includes(demoAccounts.therapist.email) && m.text.includes('Sky'))
    for (const m of [toPerson, toTherapist]) expect(m.subject).not.toMatch(/therap/i)

    // The used code no longer appears among the open invitations, and cannot be used again.
    const open = await therapist.get('/api/therapist/invitations')
    expect(open.body.invitations.map((i: { id: string }) => i.id)).not.toContain(inv.invitation.id)
    const again = await (await signedInAs(t, await makePerson(t, 'Other'))).post('/api/person/links/preview', { code: inv.code })
    expect(again.status).toBe(404)
  })

  it('returns 409 for a second active link with the same therapist', async () => {
    const therapist = await demo(t, 'therapist')
    const p = await makePerson(t, 'Jo')
    const person = await signedInAs(t, p)
    await linkUp(therapist, person)
    const { body: inv } = await therapist.post('/api/therapist/invitations', {})
    const res = await person.post('/api/person/links', { code: inv.code })
    expect(res.status).toBe(409)
    expect(res.body.error.code).toBe('already_linked')
    expect(await t.deps.models.Link.count({ where: { personId: p.user.id, state: 'active' } })).toBe(1)
    expect((await t.deps.models.Invitation.findByPk(inv.invitation.id))!.usedAt).toBeNull()
  })

  it('returns 404 with a plain message for unknown, expired and used codes', async () => {
    const therapist = await demo(t, 'therapist')
    const lee = await makePerson(t, 'Lee')
    const person = Object.assign(await signedInAs(t, lee), { userId: lee.user.id })
    const unknown = await person.post('/api/person/links/preview', { code: 'ZZZZ-ZZZZ' })
    expect(unknown.status).toBe(404)
    expect(unknown.body.error.message).toMatch(/code does not work/)

    const { body: inv } = await therapist.post('/api/therapist/invitations', {})
    await t.deps.models.Invitation.update({ expiresAt: new Date(Date.now() - 1000) }, { where: { id: inv.invitation.id } })
    expect((await person.post('/api/person/links/preview', { code: inv.code })).status).toBe(404)
    expect((await person.post('/api/person/links', { code: inv.code })).status).toBe(404)
    expect((await t.deps.models.Invitation.findByPk(inv.invitation.id))!.usedAt).toBeNull()
    expect(await t.deps.models.Link.count({ where: { personId: person.userId } })).toBe(0)
  })

  it('returns 400 for a code of the wrong shape and 403 for an unverified person', async () => {
    const person = await signedInAs(t, await makePerson(t, 'Ash'))
    const bad = await person.post('/api/person/links/preview', { code: 'ABC' })
    expect(bad.status).toBe(400)
    const unverified = await signedInAs(t, await makePerson(t, 'Kit', { verified: false }))
    const res = await unverified.post('/api/person/links/preview', { code: 'ABCD-2345' })
    expect(res.status).toBe(403)
    expect(res.body.error.code).toBe('email_unverified')
  })

  it('stops an unapproved therapist\'s open codes from working', async () => {
    const th = await makeTherapist(t, 'Morgan Vale')
    const therapist = await signedInAs(t, th)
    const { body: inv } = await therapist.post('/api/therapist/invitations', {})
    await t.deps.models.TherapistProfile.update({ approvedAt: null }, { where: { userId: th.user.id } })
    const person = await signedInAs(t, await makePerson(t, 'Rae'))
    expect((await person.post('/api/person/links', { code: inv.code })).status).toBe(404)
    expect(await t.deps.models.Link.count({ where: { therapistId: th.user.id } })).toBe(0)
  })
})

describe('GET /api/person/links and /api/therapist/links', () => {
  it('shows the seeded demo link with its next appointment to Robin, and Robin to Amara', async () => {
    const robin = await demo(t, 'person')
    const res = await robin.get('/api/person/links')
    expect(res.status).toBe(200)
    expect(res.body.links).toHaveLength(1)
    const [row] = res.body.links
    expect(row).toMatchObject({ state: 'active', therapist: { displayName: demoAccounts.therapist.displayName } })
    expect(new Date(row.nextAppointment).getTime()).toBeGreaterThan(Date.now())

    const amara = await demo(t, 'therapist')
    const mine = await amara.get('/api/therapist/links')
    expect(mine.body.links.map((l: { person: { displayName: string } }) => l.person.displayName)).toContain(demoAccounts.person.displayName)
    // The therapist sees only the person's chosen name, not their e-mail.
    expect(JSON.stringify(mine.body)).not.toContain(demoAccounts.person.email)
  })
})

describe('appointments', () => {
  it('lets the therapist add and list sessions; the person sees the next one and the latest past one', async () => {
    const th = await makeTherapist(t, 'Quinn Harrow')
    const therapist = await signedInAs(t, th)
    const person = await signedInAs(t, await makePerson(t, 'Noa'))
    const linkId = await linkUp(therapist, person)
    const soon = new Date(Date.now() + 3 * 86_400_000).toISOString()
    const later = new Date(Date.now() + 10 * 86_400_000).toISOString()
    const lastWeek = new Date(Date.now() - 7 * 86_400_000).toISOString()
    const longAgo = new Date(Date.now() - 30 * 86_400_000).toISOString()
    expect((await therapist.post(`/api/therapist/links/${linkId}/appointments`, { at: later })).status).toBe(201)
    expect((await therapist.post(`/api/therapist/links/${linkId}/appointments`, { at: soon })).status).toBe(201)
    expect(await t.deps.models.Appointment.count({ where: { linkId } })).toBe(2)
    const list = await therapist.get(`/api/therapist/links/${linkId}/appointments`)
    expect(list.body.appointments.map((a: { at: string }) => a.at)).toEqual([soon, later])
    const mine = await person.get('/api/person/links')
    expect(mine.body.links[0].nextAppointment).toBe(soon)
    expect(mine.body.links[0].lastSessionAt).toBeNull()
    expect((await therapist.post(`/api/therapist/links/${linkId}/appointments`, { at: longAgo })).status).toBe(201)
    expect((await therapist.post(`/api/therapist/links/${linkId}/appointments`, { at: lastWeek })).status).toBe(201)
    expect(await t.deps.models.Appointment.count({ where: { linkId } })).toBe(4)
    const after = await person.get('/api/person/links')
    // The summary's "since the last session" starts at the latest past one, not the earliest.
    expect(after.body.links[0]).toMatchObject({ lastSessionAt: lastWeek, nextAppointment: soon })
    expect((await therapist.post(`/api/therapist/links/${linkId}/appointments`, { at: 'next tuesday' })).status).toBe(400)
  })
})

describe('POST /api/links/:linkId/end', () => {
  it('ends the link from the person side, withdraws every copy, notifies both, and leaves the therapist nothing', async () => {
    const th = await makeTherapist(t, 'Sasha Brook')
    const therapist = await signedInAs(t, th)
    const p = await makePerson(t, 'Wren')
    const person = await signedInAs(t, p)
    const linkId = await linkUp(therapist, person)
    const e1 = randomUUID()
    const e2 = randomUUID()
    expect((await put(person, linkId, e1, 1, 'lantern-moss')).status).toBe(200)
    expect((await put(person, linkId, e2, 3, 'lantern-moss')).status).toBe(200)
    expect(await t.deps.models.SharedEntry.count({ where: { linkId, withdrawnAt: null } })).toBe(2)

    const res = await person.post(`/api/links/${linkId}/end`)
    expect(res.status).toBe(200)
    const link = await t.deps.models.Link.findByPk(linkId)
    expect(link).toMatchObject({ state: 'ended', endedBy: p.user.id })
    expect(link!.endedAt).toBeInstanceOf(Date)
    const rows = await t.deps.models.SharedEntry.findAll({ where: { linkId } })
    expect(rows).toHaveLength(2)
    for (const r of rows) {
      expect(r.payload).toBeNull()
      expect(r.withdrawnAt).toBeInstanceOf(Date)
    }
    const ended = await t.deps.fakeSmtp.waitFor((m) => m.to.includes(th.email) && m.subject.includes('ended'))
    expect(ended.subject).not.toMatch(/therap/i)
    expect(ended.text).not.toContain('lantern-moss')
    await t.deps.fakeSmtp.waitFor((m) => m.to.includes(p.email) && m.subject.includes('ended'))

    const shares = await therapist.get(`/api/therapist/links/${linkId}/shares`)
    expect(shares.status).toBe(404)
    expect(JSON.stringify(shares.body)).not.toContain('lantern-moss')
    const caseload = await therapist.get('/api/therapist/caseload')
    expect(caseload.body.caseload.map((r: { linkId: string }) => r.linkId)).not.toContain(linkId)
    expect((await put(person, linkId, e1, 2, 'lantern-moss')).status).toBe(409)
    expect(await t.deps.models.SharedEntry.count({ where: { linkId, withdrawnAt: null } })).toBe(0)

    // Ending again changes nothing; the person still sees the ended link.
    expect((await therapist.post(`/api/links/${linkId}/end`)).status).toBe(200)
    expect((await t.deps.models.Link.findByPk(linkId))!.endedBy).toBe(p.user.id)
    const mine = await person.get('/api/person/links')
    expect(mine.body.links.find((l: { id: string }) => l.id === linkId)).toMatchObject({ state: 'ended', endedBy: 'person', nextAppointment: null })
  })

  it('lets the therapist end it too, and a new invitation can then link the pair again', async () => {
    const th = await makeTherapist(t, 'Rowan Teal')
    const therapist = await signedInAs(t, th)
    const person = await signedInAs(t, await makePerson(t, 'Ira'))
    const first = await linkUp(therapist, person)
    expect((await therapist.post(`/api/links/${first}/end`)).status).toBe(200)
    expect((await t.deps.models.Link.findByPk(first))).toMatchObject({ state: 'ended', endedBy: th.user.id })
    const second = await linkUp(therapist, person)
    expect(second).not.toBe(first)
    expect(await t.deps.models.Link.count({ where: { therapistId: th.user.id, state: 'active' } })).toBe(1)
  })
})
