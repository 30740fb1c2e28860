import { randomUUID } from 'node:crypto'
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest'
import { sharePutResponseSchema } from '../../shared/schemas/share.schema'
import { DIGEST_PERIOD_MS } from '../../server/modules/shares/digest.service'
import { makeTestApp, type TestApp } from '../helpers/testApp'
import { entryPayload, linkUp, makePerson, makeTherapist, put, signedInAs, type Agent } from './linkFixtures'

let t: TestApp
// These tests move the app's clock by days; session timeouts (tested in sessions.api.spec.ts) would sign everyone out.
const longSessions = { SESSION_IDLE_MINUTES: '10000000', SESSION_ABSOLUTE_HOURS: '1000000' }
beforeAll(async () => { t = await makeTestApp(longSessions) })
afterAll(async () => { await t.close() })
afterEach(() => { t.deps.now = undefined })

async function pair(name: string, opts: { therapistNotices?: boolean } = {}) {
  const th = await makeTherapist(t, `Morgan Ellery`)
  if (opts.therapistNotices === false) await th.user.update({ emailNotices: false })
  const p = await makePerson(t, name)
  const therapist = await signedInAs(t, th)
  const person = await signedInAs(t, p)
  const linkId = await linkUp(therapist, person)
  return { th, p, therapist, person, linkId }
}

const row = (linkId: string, entryId: string) => t.deps.models.SharedEntry.findOne({ where: { linkId, entryId } })
const del = (person: Agent, linkId: string, entryId: string, version: number | string) =>
  person.del(`/api/links/${linkId}/shares/${entryId}?version=${version}`)

describe('PUT /api/links/:linkId/shares/:entryId', () => {
  it('stores a first share, computes the risk flag server-side and keeps no list of other links', async () => {
    const { person, linkId } = await pair('Avery')
    const id = randomUUID()
    const res = await put(person, linkId, id, 1, 'quiet-harbour')
    expect(res.status).toBe(200)
    expect(sharePutResponseSchema.parse(res.body)).toEqual({ status: 'stored', version: 1 })
    const r = await row(linkId, id)
    expect(r).toMatchObject({ version: 1, kind: 'moment', withdrawnAt: null, riskFlag: false, toDiscuss: false, readAt: null })
    const stored = JSON.parse(r!.payload!)
    expect(stored.body).toBe('quiet-harbour body')
    expect(stored.shares).toEqual([])

    const risky = randomUUID()
    await put(person, linkId, risky, 1, 'x', { backgroundThoughts: ['sometimes I want to die'] })
    expect((await row(linkId, risky))!.riskFlag).toBe(true)
    const rung = randomUUID()
    await put(person, linkId, rung, 1, 'x', { wants: [{ text: 'rest', ladder: [{ id: 'a', text: 'thinking about hurting myself' }] }] })
    expect((await row(linkId, rung))!.riskFlag).toBe(true)
  })

  it('is a no-op for a repeated or stale version, and stores a higher one', async () => {
    const { person, linkId } = await pair('Blair')
    const id = randomUUID()
    await put(person, linkId, id, 2, 'first-text')
    const repeat = await put(person, linkId, id, 2, 'changed-text')
    expect(repeat.body).toEqual({ status: 'unchanged', version: 2 })
    expect(JSON.parse((await row(linkId, id))!.payload!).body).toBe('first-text body')
    const stale = await put(person, linkId, id, 1, 'older-text')
    expect(stale.status).toBe(200)
    expect(stale.body).toEqual({ status: 'unchanged', version: 2 })
    expect(JSON.parse((await row(linkId, id))!.payload!).body).toBe('first-text body')
    const newer = await put(person, linkId, id, 3, 'newer-text')
    expect(newer.body).toEqual({ status: 'stored', version: 3 })
    expect(await row(linkId, id)).toMatchObject({ version: 3 })
    expect(JSON.parse((await row(linkId, id))!.payload!).body).toBe('newer-text body')
    expect(await t.deps.models.SharedEntry.count({ where: { linkId, entryId: id } })).toBe(1)
  })

  it('rejects a payload whose id or version does not match, and a payload that is not an entry', async () => {
    const { person, linkId } = await pair('Casey')
    const id = randomUUID()
    const other = await person.agent.put(`/api/links/${linkId}/shares/${id}`).set('x-csrf-token', person.token).send({ version: 1, payload: entryPayload(randomUUID(), 1, 'm') })
    expect(other.status).toBe(400)
    const mismatch = await person.agent.put(`/api/links/${linkId}/shares/${id}`).set('x-csrf-token', person.token).send({ version: 2, payload: entryPayload(id, 1, 'm') })
    expect(mismatch.status).toBe(400)
    const junk = await person.agent.put(`/api/links/${linkId}/shares/${id}`).set('x-csrf-token', person.token).send({ version: 1, payload: { id, body: 'x' } })
    expect(junk.status).toBe(400)
    expect(await row(linkId, id)).toBeNull()
  })
})

describe('DELETE /api/links/:linkId/shares/:entryId?version=N', () => {
  it('drops the payload, keeps a tombstone, is idempotent, and blocks PUTs at or below it', async () => {
    const { person, linkId } = await pair('Dana')
    const id = randomUUID()
    await put(person, linkId, id, 2, 'secret-words')
    const first = await del(person, linkId, id, 2)
    expect(first.status).toBe(200)
    expect(first.body).toEqual({ status: 'withdrawn', version: 2 })
    const r = await row(linkId, id)
    expect(r).toMatchObject({ version: 2, payload: null })
    expect(r!.withdrawnAt).toBeInstanceOf(Date)
    expect(JSON.stringify(r!.toJSON())).not.toContain('secret-words')

    const again = await del(person, linkId, id, 2)
    expect(again.status).toBe(200)
    expect(again.body).toEqual({ status: 'unchanged', version: 2 })
    expect((await row(linkId, id))!.withdrawnAt!.getTime()).toBe(r!.withdrawnAt!.getTime())

    for (const v of [1, 2]) {
      const res = await put(person, linkId, id, v, 'secret-words')
      expect(res.body).toEqual({ status: 'unchanged', version: 2 })
      expect(await row(linkId, id)).toMatchObject({ payload: null, version: 2 })
    }
    const reshare = await put(person, linkId, id, 3, 'shared-again')
    expect(reshare.body).toEqual({ status: 'stored', version: 3 })
    expect(await row(linkId, id)).toMatchObject({ version: 3, withdrawnAt: null })
    expect(JSON.parse((await row(linkId, id))!.payload!).body).toBe('shared-again body')
  })

  it('leaves a tombstone when the DELETE overtakes its PUT', async () => {
    const { person, linkId } = await pair('Eden')
    const id = randomUUID()
    expect((await del(person, linkId, id, 4)).body).toEqual({ status: 'withdrawn', version: 4 })
    expect(await row(linkId, id)).toMatchObject({ version: 4, payload: null, kind: null })
    expect((await put(person, linkId, id, 4, 'late')).body.status).toBe('unchanged')
    expect((await row(linkId, id))!.payload).toBeNull()
  })

  it('never lowers the version when an older DELETE arrives late', async () => {
    const { person, linkId } = await pair('Flynn')
    const id = randomUUID()
    await put(person, linkId, id, 5, 'text')
    expect((await del(person, linkId, id, 3)).body).toEqual({ status: 'withdrawn', version: 5 })
    expect(await row(linkId, id)).toMatchObject({ version: 5, payload: null })
    expect((await put(person, linkId, id, 5, 'text')).body.status).toBe('unchanged')
  })

  it('returns 400 without a version', async () => {
    const { person, linkId } = await pair('Gray')
    const id = randomUUID()
    expect((await person.del(`/api/links/${linkId}/shares/${id}`)).status).toBe(400)
    expect((await del(person, linkId, id, 'x')).status).toBe(400)
    expect(await row(linkId, id)).toBeNull()
  })
})

describe('GET /api/person/links/:linkId/shares', () => {
  it('shows the person their shares\' states without payloads', async () => {
    const { person, linkId } = await pair('Harper')
    const a = randomUUID()
    const b = randomUUID()
    await put(person, linkId, a, 1, 'own-words')
    await put(person, linkId, b, 2, 'own-words')
    await del(person, linkId, b, 2)
    const res = await person.get(`/api/person/links/${linkId}/shares`)
    expect(res.status).toBe(200)
    expect(JSON.stringify(res.body)).not.toContain('own-words')
    const byId = Object.fromEntries(res.body.shares.map((s: { entryId: string }) => [s.entryId, s]))
    expect(byId[a]).toMatchObject({ version: 1, withdrawnAt: null, readAt: null })
    expect(byId[b].withdrawnAt).not.toBeNull()
  })
})

describe('the "new shared entries" notice', () => {
  it('sends at most one per period, with counts only and no name or entry text', async () => {
    let now = new Date('2027-01-10T09:00:00Z')
    t.deps.now = () => now
    const { th, p, person, linkId } = await pair('Indigo')
    const mailsToTherapist = () => t.deps.fakeSmtp.messages().filter((m) => m.to.includes(th.email) && m.subject === 'New activity on Rungs')

    await put(person, linkId, randomUUID(), 1, 'private-thought')
    const first = await t.deps.fakeSmtp.waitFor((m) => m.to.includes(th.email) && m.subject === 'New activity on Rungs')
    expect(first.text).toContain('1 new shared entry from one person')
    now = new Date(now.getTime() + 10 * 60 * 1000)
    await put(person, linkId, randomUUID(), 1, 'private-thought')
    now = new Date(now.getTime() + 20 * 60 * 1000)
    await put(person, linkId, randomUUID(), 1, 'private-thought')
    await new Promise((r) => setTimeout(r, 300))
    expect(mailsToTherapist()).toHaveLength(1)
    expect(await t.deps.models.AuditEvent.count({ where: { action: 'digest.sent', subjectUserId: th.user.id } })).toBe(1)

    now = new Date(now.getTime() + DIGEST_PERIOD_MS)
    await put(person, linkId, randomUUID(), 1, 'private-thought')
    const second = await t.deps.fakeSmtp.waitFor((m) => m.to.includes(th.email) && m.text.includes('3 new shared entries from one person'))
    expect(mailsToTherapist()).toHaveLength(2)
    for (const m of [first, second]) {
      expect(m.subject).not.toMatch(/therap/i)
      expect(m.subject).not.toContain(p.user.displayName)
      expect(m.text).not.toContain('private-thought')
      expect(m.text).not.toContain(p.user.displayName)
    }
  })

  it('sends nothing to a therapist who turned notices off', async () => {
    const { th, person, linkId } = await pair('Jules', { therapistNotices: false })
    await put(person, linkId, randomUUID(), 1, 'm')
    await new Promise((r) => setTimeout(r, 300))
    expect(t.deps.fakeSmtp.messages().filter((m) => m.to.includes(th.email) && m.subject === 'New activity on Rungs')).toHaveLength(0)
    expect(await t.deps.models.AuditEvent.count({ where: { action: 'digest.sent', subjectUserId: th.user.id } })).toBe(0)
  })
})
