import { randomUUID } from 'node:crypto'
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest'
import { caseloadRowSchema } from '../../shared/schemas/prep.schema'
import { sharedEntryViewSchema } from '../../shared/schemas/share.schema'
import { makeTestApp, type TestApp } from '../helpers/testApp'
import { linkUp, makePerson, makeTherapist, put, signedInAs } from './linkFixtures'

let t: TestApp
// These tests move the app's clock by days; session timeouts (tested in sessions.api.spec.ts) would sign everyone out.
const longSessions = { SESSION_IDLE_MINUTES: '10000000', SESSION_ABSOLUTE_HOURS: '1000000' }
beforeAll(async () => { t = await makeTestApp(longSessions) })
afterAll(async () => { await t.close() })
afterEach(() => { t.deps.now = undefined })

const HOUR = 60 * 60 * 1000
const MINUTE = 60 * 1000

async function pair(name: string) {
  const th = await makeTherapist(t, 'Elliot Marsh')
  const p = await makePerson(t, name)
  const therapist = await signedInAs(t, th)
  const person = await signedInAs(t, p)
  const linkId = await linkUp(therapist, person)
  return { th, p, therapist, person, linkId }
}

describe('GET /api/therapist/caseload', () => {
  it('counts what arrived since the last session, what is to discuss, and flags risk from live copies only', async () => {
    const start = new Date('2027-02-01T09:00:00Z')
    let now = start
    t.deps.now = () => now
    const { therapist, person, linkId } = await pair('Pip')
    const at = (h: number) => new Date(start.getTime() + h * HOUR)
    const [e1, e2, e3, risky] = [randomUUID(), randomUUID(), randomUUID(), randomUUID()]
    now = at(1); await put(person, linkId, e1, 1, 'a')
    now = at(2); await put(person, linkId, e2, 1, 'b')
    now = at(2.5)
    const rowOf = async () => (await therapist.get('/api/therapist/caseload')).body.caseload.find((r: { linkId: string }) => r.linkId === linkId)

    // No appointment yet: "since the last session" is since the link started.
    let row = caseloadRowSchema.parse(await rowOf())
    expect(row).toMatchObject({ person: { displayName: 'Pip' }, lastSessionAt: null, newSinceLastSession: 2, toDiscussCount: 0, nextAppointment: null, riskFlag: false })
    expect(row.lastSharedAt).toBe(at(2).toISOString())

    expect((await therapist.post(`/api/therapist/links/${linkId}/appointments`, { at: at(3).toISOString() })).status).toBe(201)
    expect((await therapist.post(`/api/therapist/links/${linkId}/appointments`, { at: at(24 * 7).toISOString() })).status).toBe(201)
    now = at(4); await put(person, linkId, e3, 1, 'c')
    now = at(5)
    row = caseloadRowSchema.parse(await rowOf())
    expect(row).toMatchObject({ lastSessionAt: at(3).toISOString(), newSinceLastSession: 1, nextAppointment: at(24 * 7).toISOString(), lastSharedAt: at(4).toISOString() })

    expect((await therapist.patch(`/api/therapist/links/${linkId}/shares/${e1}`, { toDiscuss: true })).status).toBe(200)
    expect((await t.deps.models.SharedEntry.findOne({ where: { linkId, entryId: e1 } }))!.toDiscuss).toBe(true)
    await put(person, linkId, risky, 1, 'r', { body: 'I keep thinking about ending it all' })
    row = caseloadRowSchema.parse(await rowOf())
    expect(row).toMatchObject({ toDiscussCount: 1, riskFlag: true, newSinceLastSession: 2 })

    await person.del(`/api/links/${linkId}/shares/${risky}?version=1`)
    row = caseloadRowSchema.parse(await rowOf())
    expect(row).toMatchObject({ riskFlag: false, newSinceLastSession: 1 })
    // Counts only: the caseload carries no content, so it writes no audit row.
    expect(await t.deps.models.AuditEvent.count({ where: { action: 'shares.read', actorId: (await t.deps.models.Link.findByPk(linkId))!.therapistId } })).toBe(0)
  })
})

describe('GET /api/therapist/links/:linkId/shares and the access log', () => {
  it('returns live copies newest first, writes one audit row per returned entry, and shows them in the person\'s access log once per ten minutes', async () => {
    let now = new Date('2027-03-01T09:00:00Z')
    t.deps.now = () => now
    const { th, p, therapist, person, linkId } = await pair('Quill')
    const [older, newer, gone] = [randomUUID(), randomUUID(), randomUUID()]
    await put(person, linkId, older, 1, 'older-words')
    now = new Date(now.getTime() + HOUR)
    await put(person, linkId, newer, 2, 'newer-words')
    await put(person, linkId, gone, 1, 'gone-words')
    await person.del(`/api/links/${linkId}/shares/${gone}?version=1`)
    now = new Date(now.getTime() + HOUR)

    const res = await therapist.get(`/api/therapist/links/${linkId}/shares`)
    expect(res.status).toBe(200)
    expect(res.headers['cache-control']).toBe('no-store')
    const views = res.body.shares.map((s: unknown) => sharedEntryViewSchema.parse(s))
    expect(views.map((s: { entryId: string }) => s.entryId)).toEqual([newer, older])
    expect(views[0].payload.body).toBe('newer-words body')
    expect(JSON.stringify(res.body)).not.toContain('gone-words')

    const events = await t.deps.models.AuditEvent.findAll({ where: { action: 'shares.read', actorId: th.user.id } })
    expect(events).toHaveLength(2)
    for (const e of events) expect(e).toMatchObject({ subjectUserId: p.user.id, at: now })

    const log = await person.get(`/api/person/links/${linkId}/access-log`)
    expect(log.status).toBe(200)
    expect(log.body.events.map((e: { entryId: string }) => e.entryId).sort()).toEqual([newer, older].sort())
    expect(log.body.events[0]).toMatchObject({ at: now.toISOString(), by: 'Elliot Marsh', action: 'opened' })
    expect(JSON.stringify(log.body)).not.toMatch(/older-words|newer-words/)

    // A refresh within ten minutes is the same opening; after ten minutes it is a new one.
    now = new Date(now.getTime() + 9 * MINUTE)
    await therapist.get(`/api/therapist/links/${linkId}/shares`).expect(200)
    expect(await t.deps.models.AuditEvent.count({ where: { action: 'shares.read', actorId: th.user.id } })).toBe(2)
    now = new Date(now.getTime() + 2 * MINUTE)
    await therapist.get(`/api/therapist/links/${linkId}/shares`).expect(200)
    const after = await t.deps.models.AuditEvent.findAll({ where: { action: 'shares.read', actorId: th.user.id }, order: [['at', 'ASC']] })
    expect(after).toHaveLength(4)
    expect(after.slice(2).map((e) => e.at)).toEqual([now, now])
    expect((await person.get(`/api/person/links/${linkId}/access-log`)).body.events).toHaveLength(4)
  })

  it('logs a new version read within ten minutes, but not the unchanged copy beside it', async () => {
    let now = new Date('2027-03-02T09:00:00Z')
    t.deps.now = () => now
    const { th, person, therapist, linkId } = await pair('Wren')
    const [kept, edited] = [randomUUID(), randomUUID()]
    await put(person, linkId, kept, 1, 'kept-words')
    await put(person, linkId, edited, 1, 'first-words')
    await therapist.get(`/api/therapist/links/${linkId}/shares`).expect(200)
    now = new Date(now.getTime() + 3 * MINUTE)
    await put(person, linkId, edited, 2, 'second-words')
    now = new Date(now.getTime() + MINUTE)
    const res = await therapist.get(`/api/therapist/links/${linkId}/shares`).expect(200)
    expect(JSON.stringify(res.body)).toContain('second-words')
    const editedRow = await t.deps.models.SharedEntry.findOne({ where: { linkId, entryId: edited } })
    const keptRow = await t.deps.models.SharedEntry.findOne({ where: { linkId, entryId: kept } })
    expect(await t.deps.models.AuditEvent.count({ where: { action: 'shares.read', actorId: th.user.id, subjectId: editedRow!.id } })).toBe(2)
    expect(await t.deps.models.AuditEvent.count({ where: { action: 'shares.read', actorId: th.user.id, subjectId: keptRow!.id } })).toBe(1)
  })

  it('writes one row per copy when the same therapist sends several reads at once', async () => {
    t.deps.now = () => new Date('2027-03-03T09:00:00Z')
    const { th, person, therapist, linkId } = await pair('Yarrow')
    for (const n of [1, 2, 3]) await put(person, linkId, randomUUID(), 1, `burst-${n}`)
    const answers = await Promise.all([1, 2, 3, 4].map(() => therapist.get(`/api/therapist/links/${linkId}/shares`)))
    expect(answers.map((a) => a.status)).toEqual([200, 200, 200, 200])
    expect(await t.deps.models.AuditEvent.count({ where: { action: 'shares.read', actorId: th.user.id } })).toBe(3)
  })

  it('writes no audit row when there is nothing to return', async () => {
    const { th, therapist, linkId } = await pair('Rue')
    const res = await therapist.get(`/api/therapist/links/${linkId}/shares`)
    expect(res.body.shares).toEqual([])
    expect(await t.deps.models.AuditEvent.count({ where: { action: 'shares.read', actorId: th.user.id } })).toBe(0)
  })
})

describe('PATCH /api/therapist/links/:linkId/shares/:entryId', () => {
  it('marks read and to discuss, shows the person when it was read, and resets read on a new version', async () => {
    const { therapist, person, linkId } = await pair('Sol')
    const id = randomUUID()
    await put(person, linkId, id, 1, 'm')
    const res = await therapist.patch(`/api/therapist/links/${linkId}/shares/${id}`, { read: true, toDiscuss: true })
    expect(res.status).toBe(200)
    expect(res.body.share).toMatchObject({ entryId: id, toDiscuss: true })
    expect(JSON.stringify(res.body)).not.toContain('m body')
    const r = await t.deps.models.SharedEntry.findOne({ where: { linkId, entryId: id } })
    expect(r!.readAt).toBeInstanceOf(Date)
    expect(r!.toDiscuss).toBe(true)
    const states = await person.get(`/api/person/links/${linkId}/shares`)
    expect(states.body.shares[0].readAt).toBe(r!.readAt!.toISOString())

    await therapist.patch(`/api/therapist/links/${linkId}/shares/${id}`, { read: false })
    expect((await t.deps.models.SharedEntry.findOne({ where: { linkId, entryId: id } }))!.readAt).toBeNull()
    await therapist.patch(`/api/therapist/links/${linkId}/shares/${id}`, { read: true })
    await put(person, linkId, id, 2, 'm2')
    expect(await t.deps.models.SharedEntry.findOne({ where: { linkId, entryId: id } })).toMatchObject({ readAt: null, toDiscuss: true, version: 2 })

    expect((await therapist.patch(`/api/therapist/links/${linkId}/shares/${id}`, {})).status).toBe(400)
    expect((await therapist.patch(`/api/therapist/links/${linkId}/shares/${randomUUID()}`, { read: true })).status).toBe(404)
    await person.del(`/api/links/${linkId}/shares/${id}?version=2`)
    expect((await therapist.patch(`/api/therapist/links/${linkId}/shares/${id}`, { read: true })).status).toBe(404)
  })
})

describe('prep notes', () => {
  it('creates, edits, lists, exports and deletes the therapist\'s own notes, never shown to the person', async () => {
    const { th, therapist, person, linkId } = await pair('Tam')
    const created = await therapist.post(`/api/therapist/links/${linkId}/notes`, { text: 'Ask about the weekend plan' })
    expect(created.status).toBe(201)
    const noteId = created.body.note.id
    expect(await t.deps.models.PrepNote.findByPk(noteId)).toMatchObject({ linkId, therapistId: th.user.id, text: 'Ask about the weekend plan' })
    await therapist.post(`/api/therapist/links/${linkId}/notes`, { text: 'Second working note' })

    const edited = await therapist.patch(`/api/therapist/links/${linkId}/notes/${noteId}`, { text: 'Ask about the garden plan' })
    expect(edited.status).toBe(200)
    expect((await t.deps.models.PrepNote.findByPk(noteId))!.text).toBe('Ask about the garden plan')

    const list = await therapist.get(`/api/therapist/links/${linkId}/notes`)
    expect(list.body.notes.map((n: { text: string }) => n.text)).toEqual(['Second working note', 'Ask about the garden plan'])

    const text = await therapist.get(`/api/therapist/links/${linkId}/notes/export`)
    expect(text.status).toBe(200)
    expect(text.headers['content-type']).toMatch(/^text\/plain/)
    expect(text.headers['content-disposition']).toMatch(/attachment; filename="?rungs-notes-[0-9a-f-]+\.txt"?$/)
    expect(text.text.indexOf('garden plan')).toBeLessThan(text.text.indexOf('Second working note'))
    const json = await therapist.get(`/api/therapist/links/${linkId}/notes/export?format=json`)
    expect(json.headers['content-disposition']).toMatch(/\.json"?$/)
    expect(json.body.notes).toHaveLength(2)

    // Nothing the person can reach returns the notes.
    for (const url of ['/api/person/links', `/api/person/links/${linkId}/shares`, `/api/person/links/${linkId}/access-log`, `/api/therapist/links/${linkId}/notes`]) {
      const res = await person.get(url)
      expect(JSON.stringify(res.body)).not.toMatch(/garden plan|Second working note/)
    }

    // After the link ends the therapist keeps their own notes to read and export, but cannot add to them.
    await person.post(`/api/links/${linkId}/end`)
    expect((await therapist.get(`/api/therapist/links/${linkId}/notes`)).body.notes).toHaveLength(2)
    expect((await therapist.get(`/api/therapist/links/${linkId}/notes/export`)).status).toBe(200)
    expect((await therapist.post(`/api/therapist/links/${linkId}/notes`, { text: 'late' })).status).toBe(404)
    expect((await therapist.patch(`/api/therapist/links/${linkId}/notes/${noteId}`, { text: 'late' })).status).toBe(404)

    expect((await therapist.del(`/api/therapist/links/${linkId}/notes/${noteId}`)).status).toBe(200)
    expect(await t.deps.models.PrepNote.findByPk(noteId)).toBeNull()
    expect((await therapist.del(`/api/therapist/links/${linkId}/notes/${noteId}`)).status).toBe(404)
  })

  it('rejects an empty note', async () => {
    const { therapist, linkId } = await pair('Uma')
    expect((await therapist.post(`/api/therapist/links/${linkId}/notes`, { text: '   ' })).status).toBe(400)
    expect(await t.deps.models.PrepNote.count({ where: { linkId } })).toBe(0)
  })
})
