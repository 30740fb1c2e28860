import { randomUUID } from 'node:crypto'
import { afterAll, afterEach, beforeAll, describe, expect, it, vi } from 'vitest'
import { caseloadRowSchema, type CaseloadRow } from '../../shared/schemas/prep.schema'
import sqlite3 from 'sqlite3'
import { sessionRider, sessionUsers } from '../../server/auth/loadSessionUser'
import { CASELOAD_FINGERPRINT_RIDER, caseloadCache, caseloadFingerprint, caseloadFingerprintRider } from '../../server/modules/prep/caseloadCache'
import { caseload } from '../../server/modules/prep/prep.service'
import { agentWithCsrf, makeTestApp, type TestApp } from '../helpers/testApp'
import { demo, linkUp, makePerson, makeTherapist, put, signedInAs, type Agent } from './linkFixtures'

// A stale caseload is a clinical hazard (DEVELOPERS.md, hazard log H22): every write the caseload shows must reach the
// next answer, through this instance or another one on the same database. Runs on SQLite, and on PostgreSQL when
// TEST_DATABASE_URL is set.
const env = { SESSION_SECRET: 'one-secret-for-every-instance-of-rungs-c', SESSION_IDLE_MINUTES: '10000000', SESSION_ABSOLUTE_HOURS: '1000000' }
let t: TestApp
let other: TestApp
beforeAll(async () => {
  t = await makeTestApp(env)
  other = await makeTestApp({ ...env, DATABASE_URL: t.databaseUrl })
})
afterAll(async () => {
  await other?.close()
  await t?.close()
})
afterEach(() => {
  t.deps.now = undefined
})

const HOUR = 3_600_000
const DAY = 24 * HOUR

async function pair(name: string, app: TestApp = t) {
  const th = await makeTherapist(t, `Therapist of ${name}`)
  const p = await makePerson(t, name)
  const therapist = await signedInAs(app, th)
  const person = await signedInAs(app, p)
  const linkId = await linkUp(therapist, person)
  return { th, p, therapist, person, linkId }
}

/**
 * A cache of the same kind the route uses, counting its builds, beside the route itself: a write must make both give
 * the new answer, and with no write the cache must answer without building.
 */
function watch(therapistId: string) {
  let builds = 0
  const cache = caseloadCache(t.deps, { build: (deps, id) => ((builds += 1), caseload(deps, id)) })
  const rows = async () => (JSON.parse((await cache.get(therapistId)).body.toString()) as { caseload: CaseloadRow[] }).caseload.map((r) => caseloadRowSchema.parse(r))
  return {
    get builds() {
      return builds
    },
    rows,
    row: async (linkId: string) => (await rows()).find((r) => r.linkId === linkId),
  }
}

const routeRows = async (a: Agent) => {
  const res = await a.get('/api/therapist/caseload')
  expect(res.status).toBe(200)
  return (res.body.caseload as unknown[]).map((r) => caseloadRowSchema.parse(r))
}
const routeRow = async (a: Agent, linkId: string) => (await routeRows(a)).find((r) => r.linkId === linkId)

/**
 * Counts the SQL statements the app sends from now on. SQLite: every statement of the driver runs through one of its
 * Statement methods (plainSelect's own, and Sequelize's through Database.all and run), or Database.exec. PostgreSQL:
 * plainSelect and Sequelize both go through sequelize.query.
 */
function countStatements() {
  const spies =
    t.deps.sequelize.getDialect() === 'sqlite'
      ? [
          ...(['all', 'run', 'get', 'each'] as const).map((m) => vi.spyOn(sqlite3.Statement.prototype, m)),
          vi.spyOn(sqlite3.Database.prototype, 'exec'),
        ]
      : [vi.spyOn(t.deps.sequelize, 'query')]
  return {
    stop() {
      const n = spies.reduce((sum, s) => sum + s.mock.calls.length, 0)
      for (const s of spies) s.mockRestore()
      return n
    },
  }
}

/** Warms both the counting cache and the route's own, and checks a second read is served without building. */
async function warm(w: ReturnType<typeof watch>, therapist: Agent, linkId: string) {
  const before = await w.row(linkId)
  const builds = w.builds
  expect(await w.row(linkId)).toEqual(before)
  expect(w.builds).toBe(builds)
  expect(await routeRow(therapist, linkId)).toEqual(before)
  return before
}

describe('the cached caseload follows every write', () => {
  it('is reused while nothing changes, and answers If-None-Match with 304 until a write', async () => {
    const { th, therapist, person, linkId } = await pair('Ansel')
    const w = watch(th.user.id)
    await w.rows()
    await w.rows()
    await w.rows()
    expect(w.builds).toBe(1)

    const first = await therapist.get('/api/therapist/caseload')
    expect(first.status).toBe(200)
    const etag = first.headers.etag as string
    expect(etag).toMatch(/^W\/"/)
    const again = await therapist.agent.get('/api/therapist/caseload').set('If-None-Match', etag)
    expect(again.status).toBe(304)
    await put(person, linkId, randomUUID(), 1, 'ansel').expect(200)
    const changed = await therapist.agent.get('/api/therapist/caseload').set('If-None-Match', etag)
    expect(changed.status).toBe(200)
    expect(changed.headers.etag).not.toBe(etag)
    expect(changed.body.caseload[0].newSinceLastSession).toBe(1)
  })

  it('shows a new share, a new version and a withdrawal at once', async () => {
    const { th, therapist, person, linkId } = await pair('Bryn')
    const w = watch(th.user.id)
    expect(await warm(w, therapist, linkId)).toMatchObject({ newSinceLastSession: 0, lastSharedAt: null, riskFlag: false })
    const id = randomUUID()

    await put(person, linkId, id, 1, 'bryn').expect(200)
    const stored = await t.deps.models.SharedEntry.findOne({ where: { linkId, entryId: id } })
    expect((await w.row(linkId))).toMatchObject({ newSinceLastSession: 1, lastSharedAt: stored!.sharedAt!.toISOString() })
    expect(await routeRow(therapist, linkId)).toMatchObject({ newSinceLastSession: 1 })

    await warm(w, therapist, linkId)
    await put(person, linkId, id, 2, 'bryn', { body: 'I keep thinking about ending it all' }).expect(200)
    expect((await t.deps.models.SharedEntry.findOne({ where: { linkId, entryId: id } }))!.riskFlag).toBe(true)
    expect(await w.row(linkId)).toMatchObject({ riskFlag: true })
    expect(await routeRow(therapist, linkId)).toMatchObject({ riskFlag: true })

    await warm(w, therapist, linkId)
    await person.del(`/api/links/${linkId}/shares/${id}?version=2`).expect(200)
    expect((await t.deps.models.SharedEntry.findOne({ where: { linkId, entryId: id } }))!.payload).toBeNull()
    expect(await w.row(linkId)).toMatchObject({ riskFlag: false, newSinceLastSession: 0, lastSharedAt: null })
    expect(await routeRow(therapist, linkId)).toMatchObject({ riskFlag: false, newSinceLastSession: 0 })
  })

  it('shows a shared questionnaire, and earlier scores uploaded and removed', async () => {
    const { th, therapist, person, linkId } = await pair('Cerys')
    const w = watch(th.user.id)
    expect((await warm(w, therapist, linkId))!.measures).toEqual({ phq9: null, gad7: null })
    const at = Date.UTC(2026, 8, 14, 9)
    // US Core phq-9-example: [2,2,2,2,1,1,2,0,0] → 12 moderate (REFERENCE check value 1)
    await put(person, linkId, randomUUID(), 1, 'm', { kind: 'measure', createdAt: at, body: '', wants: [], backgroundThoughts: [], tags: [], measure: { instrument: 'phq9', answers: [2, 2, 2, 2, 1, 1, 2, 0, 0], completedAt: at } }).expect(200)
    expect((await w.row(linkId))!.measures.phq9).toMatchObject({ latest: 12, band: 'moderate' })
    expect((await routeRow(therapist, linkId))!.measures.phq9).toMatchObject({ latest: 12 })

    await warm(w, therapist, linkId)
    const up = await therapist.agent
      .post(`/api/therapist/links/${linkId}/earlier-scores`)
      .set('x-csrf-token', therapist.token)
      .attach('file', Buffer.from('date,measure,total,item9\n2026-08-03,GAD-7,12,\n'), { filename: 'earlier.csv', contentType: 'text/csv' })
    expect(up.status).toBe(201)
    expect(await t.deps.models.EarlierScore.count({ where: { linkId } })).toBe(1)
    expect((await w.row(linkId))!.measures.gad7).toMatchObject({ latest: 12, source: 'therapist' })
    expect((await routeRow(therapist, linkId))!.measures.gad7).toMatchObject({ latest: 12 })

    await warm(w, therapist, linkId)
    const scoreId = up.body.scores[0].id as string
    await therapist.del(`/api/therapist/links/${linkId}/earlier-scores/${scoreId}`).expect(200)
    expect(await t.deps.models.EarlierScore.count({ where: { linkId } })).toBe(0)
    expect((await w.row(linkId))!.measures.gad7).toBeNull()
    expect((await routeRow(therapist, linkId))!.measures.gad7).toBeNull()
  })

  it('shows to-discuss marks, and rebuilds on read marks', async () => {
    const { th, therapist, person, linkId } = await pair('Dilys')
    const id = randomUUID()
    await put(person, linkId, id, 1, 'dilys').expect(200)
    const w = watch(th.user.id)
    expect(await warm(w, therapist, linkId)).toMatchObject({ toDiscussCount: 0 })
    await therapist.patch(`/api/therapist/links/${linkId}/shares/${id}`, { toDiscuss: true }).expect(200)
    expect((await t.deps.models.SharedEntry.findOne({ where: { linkId, entryId: id } }))!.toDiscuss).toBe(true)
    expect(await w.row(linkId)).toMatchObject({ toDiscussCount: 1 })
    expect(await routeRow(therapist, linkId)).toMatchObject({ toDiscussCount: 1 })

    await warm(w, therapist, linkId)
    const builds = w.builds
    await therapist.patch(`/api/therapist/links/${linkId}/shares/${id}`, { read: true }).expect(200)
    expect((await t.deps.models.SharedEntry.findOne({ where: { linkId, entryId: id } }))!.readAt).not.toBeNull()
    await w.rows()
    expect(w.builds).toBe(builds + 1)
  })

  it('shows a new appointment, and turns it into the last session when its time comes without any write', async () => {
    let now = new Date('2027-05-03T09:00:00Z')
    t.deps.now = () => now
    const { th, therapist, person, linkId } = await pair('Emrys')
    now = new Date(now.getTime() + HOUR)
    await put(person, linkId, randomUUID(), 1, 'emrys').expect(200)
    const w = watch(th.user.id)
    expect(await warm(w, therapist, linkId)).toMatchObject({ nextAppointment: null, lastSessionAt: null, newSinceLastSession: 1 })
    const at = new Date(now.getTime() + 2 * HOUR)
    await therapist.post(`/api/therapist/links/${linkId}/appointments`, { at: at.toISOString() }).expect(201)
    expect(await t.deps.models.Appointment.count({ where: { linkId } })).toBe(1)
    expect(await w.row(linkId)).toMatchObject({ nextAppointment: at.toISOString(), lastSessionAt: null })
    expect(await routeRow(therapist, linkId)).toMatchObject({ nextAppointment: at.toISOString() })

    now = new Date(at.getTime() - 1)
    await warm(w, therapist, linkId)
    now = at
    expect(await w.row(linkId)).toMatchObject({ nextAppointment: null, lastSessionAt: at.toISOString(), newSinceLastSession: 0 })
    expect(await routeRow(therapist, linkId)).toMatchObject({ nextAppointment: null, lastSessionAt: at.toISOString(), newSinceLastSession: 0 })
  })

  it('adds a person when a link starts, and drops them when either side ends it', async () => {
    const th = await makeTherapist(t, 'Ffion Wade')
    const therapist = await signedInAs(t, th)
    const w = watch(th.user.id)
    expect(await w.rows()).toEqual([])
    expect(await routeRows(therapist)).toEqual([])

    const first = await signedInAs(t, await makePerson(t, 'Gethin'))
    const firstLink = await linkUp(therapist, first)
    expect((await w.rows()).map((r) => r.linkId)).toEqual([firstLink])
    expect((await routeRows(therapist)).map((r) => r.linkId)).toEqual([firstLink])
    const second = await signedInAs(t, await makePerson(t, 'Heledd'))
    const secondLink = await linkUp(therapist, second)
    expect((await w.rows()).map((r) => r.person.displayName).sort()).toEqual(['Gethin', 'Heledd'])

    await first.post(`/api/links/${firstLink}/end`).expect(200)
    expect((await t.deps.models.Link.findByPk(firstLink))!.state).toBe('ended')
    expect((await w.rows()).map((r) => r.linkId)).toEqual([secondLink])
    expect((await routeRows(therapist)).map((r) => r.linkId)).toEqual([secondLink])

    await therapist.post(`/api/links/${secondLink}/end`).expect(200)
    expect((await t.deps.models.Link.findByPk(secondLink))!.state).toBe('ended')
    expect(await w.rows()).toEqual([])
    expect(await routeRows(therapist)).toEqual([])
  })

  it('shows a new display name and drops a person who closes their account', async () => {
    const { th, p, therapist, person, linkId } = await pair('Idris')
    const w = watch(th.user.id)
    expect(await warm(w, therapist, linkId)).toMatchObject({ person: { displayName: 'Idris' } })
    await person.patch('/api/person/preferences', { displayName: 'Iddy' }).expect(200)
    expect((await t.deps.models.User.findByPk(p.user.id))!.displayName).toBe('Iddy')
    expect(await w.row(linkId)).toMatchObject({ person: { displayName: 'Iddy' } })
    expect(await routeRow(therapist, linkId)).toMatchObject({ person: { displayName: 'Iddy' } })

    await warm(w, therapist, linkId)
    await person.agent.delete('/api/me').set('x-csrf-token', person.token).send({ password: p.password }).expect(200)
    expect((await t.deps.models.Link.findByPk(linkId))!.state).toBe('ended')
    expect(await w.row(linkId)).toBeUndefined()
    expect(await routeRow(therapist, linkId)).toBeUndefined()
  })

  it('rebuilds when an admin disables or enables a linked person', async () => {
    const { th, p, therapist, linkId } = await pair('Jory')
    const admin = await demo(t, 'admin')
    const w = watch(th.user.id)
    await warm(w, therapist, linkId)
    const fingerprint = await caseloadFingerprint(t.deps, th.user.id)
    await admin.patch(`/api/admin/accounts/${p.user.id}`, { disabled: true }).expect(200)
    expect((await t.deps.models.User.findByPk(p.user.id))!.disabledAt).not.toBeNull()
    const disabled = await caseloadFingerprint(t.deps, th.user.id)
    expect(disabled).not.toBe(fingerprint)
    const builds = w.builds
    await w.rows()
    expect(w.builds).toBe(builds + 1)
    await admin.patch(`/api/admin/accounts/${p.user.id}`, { disabled: false }).expect(200)
    expect(await caseloadFingerprint(t.deps, th.user.id)).not.toBe(disabled)
  })

  it('sees a write made through another instance on the same database', async () => {
    const th = await makeTherapist(t, 'Kerensa Hale')
    const p = await makePerson(t, 'Lowen')
    const therapist = await signedInAs(t, th)
    // The person uses the other instance throughout, as a load balancer may send them.
    const person = await agentWithCsrf(other.app)
    expect((await person.signIn(p.email, p.password)).status).toBe(200)
    const linkId = await linkUp(therapist, person)
    const w = watch(th.user.id)
    expect(await warm(w, therapist, linkId)).toMatchObject({ newSinceLastSession: 0 })
    await put(person, linkId, randomUUID(), 1, 'lowen').expect(200)
    expect(await t.deps.models.SharedEntry.count({ where: { linkId } })).toBe(1)
    expect(await w.row(linkId)).toMatchObject({ newSinceLastSession: 1 })
    expect(await routeRow(therapist, linkId)).toMatchObject({ newSinceLastSession: 1 })
  })

  it('sees a write made straight through the models, and ignores one that was rolled back', async () => {
    const { th, therapist, person, linkId } = await pair('Morwen')
    const id = randomUUID()
    await put(person, linkId, id, 1, 'morwen').expect(200)
    const w = watch(th.user.id)
    expect(await warm(w, therapist, linkId)).toMatchObject({ toDiscussCount: 0 })
    const fingerprint = await caseloadFingerprint(t.deps, th.user.id)

    await t.deps.sequelize
      .transaction(async (transaction) => {
        await t.deps.models.SharedEntry.update({ toDiscuss: true }, { where: { linkId, entryId: id }, transaction })
        throw new Error('rolled back on purpose')
      })
      .catch(() => undefined)
    expect((await t.deps.models.SharedEntry.findOne({ where: { linkId, entryId: id } }))!.toDiscuss).toBe(false)
    expect(await caseloadFingerprint(t.deps, th.user.id)).toBe(fingerprint)
    const builds = w.builds
    expect(await w.row(linkId)).toMatchObject({ toDiscussCount: 0 })
    expect(w.builds).toBe(builds)

    await t.deps.models.SharedEntry.update({ toDiscuss: true }, { where: { linkId, entryId: id } })
    await t.deps.models.Appointment.create({ linkId, at: new Date(Date.now() + DAY) })
    expect(await w.row(linkId)).toMatchObject({ toDiscussCount: 1 })
    expect(await routeRow(therapist, linkId)).toMatchObject({ toDiscussCount: 1 })
  })

  it("keeps one therapist's answer apart from another's", async () => {
    const a = await pair('Nesta')
    const b = await pair('Osian')
    const [rowsA, rowsB] = [await routeRows(a.therapist), await routeRows(b.therapist)]
    expect(rowsA.map((r) => r.linkId)).toEqual([a.linkId])
    expect(rowsB.map((r) => r.linkId)).toEqual([b.linkId])
    const before = await caseloadFingerprint(t.deps, b.th.user.id)
    await put(a.person, a.linkId, randomUUID(), 1, 'nesta').expect(200)
    // A write on one therapist's caseload leaves the other's fingerprint, and so their cached answer, as it was.
    expect(await caseloadFingerprint(t.deps, b.th.user.id)).toBe(before)
    expect((await routeRows(b.therapist)).map((r) => r.newSinceLastSession)).toEqual([0])
    expect((await routeRows(a.therapist)).map((r) => r.newSinceLastSession)).toEqual([1])
  })
})

describe('the per-request reads in front of the caseload', () => {
  it('brings the signed-in user with the session row, equal to findByPk, and only for the user the session names', async () => {
    const th = await makeTherapist(t, 'Pasco Reed')
    await signedInAs(t, th)
    const rows = await t.deps.models.Session.findAll({ where: { userId: th.user.id } })
    expect(rows).toHaveLength(1)
    const sid = rows[0]!.sid

    const users = sessionUsers(t.deps.models)
    const data = await users.readSession(String(t.deps.models.Session.getTableName()), sid)
    expect(JSON.parse(data!).passport.user).toBe(th.user.id)
    expect(users.take(sid, randomUUID())).toBeUndefined()
    await users.readSession(String(t.deps.models.Session.getTableName()), sid)
    const handed = users.take(sid, th.user.id)!
    const found = await t.deps.models.User.findByPk(th.user.id, { include: [{ model: t.deps.models.TherapistProfile, as: 'therapistProfile' }] })
    expect(handed.get({ plain: true })).toEqual(found!.get({ plain: true }))
    expect(handed.isNewRecord).toBe(false)
    // Taken once: a second take for the same session finds nothing.
    expect(users.take(sid, th.user.id)).toBeUndefined()
    expect(await users.readSession(String(t.deps.models.Session.getTableName()), 'no-such-session')).toBeNull()
  })

  it('answers a cached caseload with one statement, the session read, which brings the fingerprint along', async () => {
    const { th, p, therapist, person, linkId } = await pair('Seren')
    // The first builds the answer; the second is a cache hit after any session write of this minute is done.
    await routeRows(therapist)
    await routeRows(therapist)
    const count = countStatements()
    const rows = await routeRows(therapist)
    expect(count.stop()).toBe(1)
    expect(rows.map((r) => r.linkId)).toEqual([linkId])

    const users = sessionUsers(t.deps.models, caseloadFingerprintRider)
    const table = String(t.deps.models.Session.getTableName())
    const sidOf = async (id: string) => (await t.deps.models.Session.findOne({ where: { userId: id } }))!.sid
    const [sidT, sidP] = [await sidOf(th.user.id), await sidOf(p.user.id)]
    await users.readSession(table, sidT)
    const read = users.take(sidT, th.user.id)
    expect(sessionRider(read, CASELOAD_FINGERPRINT_RIDER)).toBe(await caseloadFingerprint(t.deps, th.user.id))
    // A write moves the fingerprint the next session read brings, so the cached answer is not reused.
    await put(person, linkId, randomUUID(), 1, 'seren').expect(200)
    await users.readSession(table, sidT)
    const after = sessionRider(users.take(sidT, th.user.id), CASELOAD_FINGERPRINT_RIDER)
    expect(after).not.toBe(sessionRider(read, CASELOAD_FINGERPRINT_RIDER))
    expect(after).toBe(await caseloadFingerprint(t.deps, th.user.id))
    expect((await routeRow(therapist, linkId))!.newSinceLastSession).toBe(1)
    // Only therapists have a caseload: a person's session brings no fingerprint.
    await users.readSession(table, sidP)
    expect(sessionRider(users.take(sidP, p.user.id), CASELOAD_FINGERPRINT_RIDER)).toBeNull()
  })

  it('builds each user as an instance of its own, though the include is checked once for all of them', async () => {
    const approved = await makeTherapist(t, 'Quill Amberley')
    const pending = await makeTherapist(t, 'Rowan Tessaly', { approved: false })
    await signedInAs(t, approved)
    await signedInAs(t, pending)
    const users = sessionUsers(t.deps.models)
    const table = String(t.deps.models.Session.getTableName())
    const sidOf = async (id: string) => (await t.deps.models.Session.findOne({ where: { userId: id } }))!.sid
    const [sidA, sidB] = [await sidOf(approved.user.id), await sidOf(pending.user.id)]
    await users.readSession(table, sidA)
    const a = users.take(sidA, approved.user.id)!
    await users.readSession(table, sidB)
    const b = users.take(sidB, pending.user.id)!
    expect(a.therapistProfile!.approvedAt).toBeInstanceOf(Date)
    expect(b.therapistProfile!.approvedAt).toBeNull()
    expect(a.therapistProfile).not.toBe(b.therapistProfile)
    // A change to one instance is its own: nothing it holds is shared with the next user built.
    a.set('displayName', 'Changed Here')
    a.therapistProfile!.set('practice', 'Changed practice')
    expect(a.changed()).toEqual(['displayName'])
    expect(b.changed()).toBe(false)
    expect(b.displayName).toBe('Rowan Tessaly')
    expect(b.therapistProfile!.changed()).toBe(false)
    await users.readSession(table, sidA)
    const again = users.take(sidA, approved.user.id)!
    expect(again.displayName).toBe('Quill Amberley')
    expect(again.therapistProfile!.practice).not.toBe('Changed practice')
  })
})
