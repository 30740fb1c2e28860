import { randomUUID } from 'node:crypto'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { makeTestApp, type TestApp } from '../helpers/testApp'
import { agentWithCsrf } from '../helpers/testApp'
import { demo, entryPayload, linkUp, makePerson, makeTherapist, put, signedInAs, type Agent } from './linkFixtures'

let t: TestApp
const SECRET = 'cobalt-orchard-whisper'
const NOTE_SECRET = 'note-about-the-tidewater'
const OWNER_NAME = 'Zephyrine'
const ids = { link: '', entry: '', note: '', earlier: '', otherLink: '', otherClientLink: '' }
const actors: Record<string, Agent> = {}

beforeAll(async () => {
  t = await makeTestApp()
  const ownerTherapist = await makeTherapist(t, 'Octavia Lund')
  const owner = await makePerson(t, OWNER_NAME)
  actors.ownerTherapist = await signedInAs(t, ownerTherapist)
  actors.owner = await signedInAs(t, owner)
  ids.link = await linkUp(actors.ownerTherapist, actors.owner)
  ids.entry = randomUUID()
  expect((await put(actors.owner, ids.link, ids.entry, 2, SECRET)).status).toBe(200)
  ids.note = (await actors.ownerTherapist.post(`/api/therapist/links/${ids.link}/notes`, { text: NOTE_SECRET })).body.note.id
  await actors.ownerTherapist.post(`/api/therapist/links/${ids.link}/appointments`, { at: new Date(Date.now() + 86_400_000).toISOString() })
  const earlier = await actors.ownerTherapist.agent
    .post(`/api/therapist/links/${ids.link}/earlier-scores`)
    .set('x-csrf-token', actors.ownerTherapist.token)
    .attach('file', Buffer.from('date,measure,total\n2026-08-03,PHQ-9,17\n'), { filename: 'earlier.csv', contentType: 'text/csv' })
  expect(earlier.status).toBe(201)
  ids.earlier = earlier.body.scores[0].id

  // Another person with their own therapist, so IDOR attempts can use real ids of their own.
  actors.otherTherapist = await signedInAs(t, await makeTherapist(t, 'Basil Fenn'))
  actors.otherPerson = await signedInAs(t, await makePerson(t, 'Marlowe'))
  ids.otherLink = await linkUp(actors.otherTherapist, actors.otherPerson)
  ids.otherClientLink = ids.otherLink
  actors.unapproved = await signedInAs(t, await makeTherapist(t, 'Piers Unchecked', { approved: false }))
  actors.admin = await demo(t, 'admin')
  actors.anonymous = await agentWithCsrf(t.app)
})
afterAll(async () => { await t.close() })

type Method = 'get' | 'post' | 'put' | 'patch' | 'delete'
/** `self: 'account'` routes act on the caller's own account, so they have no one else's id to guess. */
interface RouteCase { name: string; method: Method; url: () => string; body?: () => object; self?: 'person' | 'therapist' | 'account' }

const L = () => ids.link
const routes: RouteCase[] = [
  { name: 'create invitation', method: 'post', url: () => '/api/therapist/invitations', body: () => ({}), self: 'therapist' },
  { name: 'list invitations', method: 'get', url: () => '/api/therapist/invitations', self: 'therapist' },
  { name: 'preview a code', method: 'post', url: () => '/api/person/links/preview', body: () => ({ code: 'ZZZZ-ZZZZ' }), self: 'person' },
  { name: 'confirm a code', method: 'post', url: () => '/api/person/links', body: () => ({ code: 'ZZZZ-ZZZZ' }), self: 'person' },
  { name: 'person links', method: 'get', url: () => '/api/person/links', self: 'person' },
  { name: 'therapist links', method: 'get', url: () => '/api/therapist/links', self: 'therapist' },
  { name: 'caseload', method: 'get', url: () => '/api/therapist/caseload', self: 'therapist' },
  { name: 'end link', method: 'post', url: () => `/api/links/${L()}/end` },
  { name: 'add appointment', method: 'post', url: () => `/api/therapist/links/${L()}/appointments`, body: () => ({ at: '2027-05-05T10:00:00Z' }) },
  { name: 'list appointments', method: 'get', url: () => `/api/therapist/links/${L()}/appointments` },
  { name: 'put share', method: 'put', url: () => `/api/links/${L()}/shares/${ids.entry}`, body: () => ({ version: 9, payload: entryPayload(ids.entry, 9, 'overwrite') }) },
  { name: 'delete share', method: 'delete', url: () => `/api/links/${L()}/shares/${ids.entry}?version=9` },
  { name: 'read shares', method: 'get', url: () => `/api/therapist/links/${L()}/shares` },
  { name: 'patch share', method: 'patch', url: () => `/api/therapist/links/${L()}/shares/${ids.entry}`, body: () => ({ read: true, toDiscuss: true }) },
  { name: 'list notes', method: 'get', url: () => `/api/therapist/links/${L()}/notes` },
  { name: 'add note', method: 'post', url: () => `/api/therapist/links/${L()}/notes`, body: () => ({ text: 'intruder' }) },
  { name: 'edit note', method: 'patch', url: () => `/api/therapist/links/${L()}/notes/${ids.note}`, body: () => ({ text: 'intruder' }) },
  { name: 'delete note', method: 'delete', url: () => `/api/therapist/links/${L()}/notes/${ids.note}` },
  { name: 'export notes', method: 'get', url: () => `/api/therapist/links/${L()}/notes/export` },
  { name: 'access log', method: 'get', url: () => `/api/person/links/${L()}/access-log` },
  { name: 'share states', method: 'get', url: () => `/api/person/links/${L()}/shares` },
  { name: 'link measures', method: 'get', url: () => `/api/therapist/links/${L()}/measures` },
  { name: 'measures CSV', method: 'get', url: () => `/api/therapist/links/${L()}/measures.csv` },
  { name: 'measures FHIR', method: 'get', url: () => `/api/therapist/links/${L()}/measures/fhir` },
  { name: 'upload earlier scores', method: 'post', url: () => `/api/therapist/links/${L()}/earlier-scores`, body: () => ({}) },
  { name: 'list earlier scores', method: 'get', url: () => `/api/therapist/links/${L()}/earlier-scores` },
  { name: 'delete earlier score', method: 'delete', url: () => `/api/therapist/links/${L()}/earlier-scores/${ids.earlier}` },
  { name: 'person earlier scores', method: 'get', url: () => `/api/links/${L()}/earlier-scores` },
  { name: 'download my account', method: 'get', url: () => '/api/me/export', self: 'account' },
  { name: 'close my account', method: 'delete', url: () => '/api/me', body: () => ({ password: 'a-wrong-guess-at-it' }), self: 'account' },
]

function call(a: Agent, r: RouteCase) {
  const req = a.agent[r.method](r.url()).set('x-csrf-token', a.token)
  return r.body ? req.send(r.body()) : req
}

const isTherapistRoute = (r: RouteCase) => r.url().startsWith('/api/therapist/')
const isPersonRoute = (r: RouteCase) =>
  r.url().startsWith('/api/person/') ||
  (r.url().includes('/shares/') && (r.method === 'put' || r.method === 'delete')) ||
  (r.url().startsWith('/api/links/') && r.url().endsWith('/earlier-scores'))

/** What each outsider must get: 401 signed out, 403 for the wrong role, 404 for the right role on someone else's id. */
function expected(actor: string, r: RouteCase): number[] {
  if (actor === 'anonymous') return [401]
  // The person's own download works; closing needs the right password, and staff accounts are closed by an admin.
  if (r.self === 'account') return actor === 'otherPerson' && r.method === 'get' ? [200] : [403]
  if (actor === 'admin') return [403]
  if (actor === 'unapproved') return isTherapistRoute(r) || isPersonRoute(r) ? [403] : [404]
  if (actor === 'otherPerson') {
    if (isTherapistRoute(r)) return [403]
    if (r.self === 'person') return r.method === 'get' ? [200] : [404]
    return [404]
  }
  // otherTherapist
  if (isPersonRoute(r)) return [403]
  if (r.self === 'therapist') return r.method === 'get' ? [200] : [201]
  return [404]
}

async function ownerStateUnchanged() {
  const link = await t.deps.models.Link.findByPk(ids.link)
  expect(link!.state).toBe('active')
  const share = await t.deps.models.SharedEntry.findOne({ where: { linkId: ids.link, entryId: ids.entry } })
  expect(share).toMatchObject({ version: 2, withdrawnAt: null, readAt: null, toDiscuss: false })
  expect(JSON.parse(share!.payload!).body).toBe(`${SECRET} body`)
  const note = await t.deps.models.PrepNote.findByPk(ids.note)
  expect(note!.text).toBe(NOTE_SECRET)
  expect(await t.deps.models.PrepNote.count({ where: { linkId: ids.link } })).toBe(1)
  expect(await t.deps.models.Appointment.count({ where: { linkId: ids.link } })).toBe(1)
  expect(await t.deps.models.EarlierScore.count({ where: { linkId: ids.link } })).toBe(1)
  expect(await t.deps.models.EarlierScore.findByPk(ids.earlier)).toMatchObject({ total: 17, instrument: 'phq9' })
  expect(await t.deps.models.AuditEvent.count({ where: { action: 'shares.read', subjectUserId: link!.personId } })).toBe(0)
}

describe('authorisation matrix: every new route × every outsider', () => {
  for (const actor of ['anonymous', 'admin', 'unapproved', 'otherPerson', 'otherTherapist']) {
    describe(actor, () => {
      for (const r of routes) {
        it(`${r.method.toUpperCase()} ${r.name} → ${expected(actor, r).join('/')} and leaks nothing`, async () => {
          const res = await call(actors[actor]!, r)
          expect(expected(actor, r)).toContain(res.status)
          const body = JSON.stringify(res.body ?? '') + (res.text ?? '')
          for (const secret of [SECRET, NOTE_SECRET, OWNER_NAME, ids.note]) expect(body).not.toContain(secret)
          if (res.status >= 400) expect(res.body.error.code).toMatch(/^(unauthenticated|forbidden|not_approved|not_found|wrong_password)$/)
          await ownerStateUnchanged()
        })
      }
    })
  }
})

describe('IDOR attempts with real ids of someone else', () => {
  it('another person sharing onto their own link with the owner\'s entry id touches only their own row', async () => {
    const res = await put(actors.otherPerson!, ids.otherLink, ids.entry, 50, 'marlowe-text')
    expect(res.body.status).toBe('stored')
    expect(await t.deps.models.SharedEntry.count({ where: { entryId: ids.entry } })).toBe(2)
    await actors.otherPerson!.del(`/api/links/${ids.otherLink}/shares/${ids.entry}?version=60`)
    await ownerStateUnchanged()
  })

  it('another therapist cannot delete the owner\'s earlier score through their own client\'s link', async () => {
    const res = await actors.otherTherapist!.del(`/api/therapist/links/${ids.otherClientLink}/earlier-scores/${ids.earlier}`)
    expect(res.status).toBe(404)
    await ownerStateUnchanged()
  })

  it('another therapist cannot reach the owner\'s entry or note through their own client\'s link', async () => {
    const other = actors.otherTherapist!
    const patch = await other.patch(`/api/therapist/links/${ids.otherClientLink}/shares/${ids.entry}`, { read: true })
    expect(patch.status).toBe(404)
    const edit = await other.patch(`/api/therapist/links/${ids.otherClientLink}/notes/${ids.note}`, { text: 'intruder' })
    expect(edit.status).toBe(404)
    const drop = await other.del(`/api/therapist/links/${ids.otherClientLink}/notes/${ids.note}`)
    expect(drop.status).toBe(404)
    for (const res of [patch, edit, drop]) expect(JSON.stringify(res.body)).not.toMatch(new RegExp(`${SECRET}|${NOTE_SECRET}`))
    await ownerStateUnchanged()
  })

  it('the owner\'s own therapist cannot use the other link\'s id', async () => {
    const res = await actors.ownerTherapist!.get(`/api/therapist/links/${ids.otherLink}/shares`)
    expect(res.status).toBe(404)
    expect(JSON.stringify(res.body)).not.toContain('marlowe-text')
  })

  it('a made-up link id answers exactly like someone else\'s', async () => {
    const made = await actors.otherTherapist!.get(`/api/therapist/links/${randomUUID()}/shares`)
    const real = await actors.otherTherapist!.get(`/api/therapist/links/${ids.link}/shares`)
    expect(made.status).toBe(real.status)
    expect(made.body).toEqual(real.body)
  })

  it('an invalid id is a 400, never a 500', async () => {
    const res = await actors.ownerTherapist!.get('/api/therapist/links/not-a-uuid/shares')
    expect(res.status).toBe(400)
  })
})
