import { randomUUID } from 'node:crypto'
import http from 'node:http'
import type { AddressInfo } from 'node:net'
import fc from 'fast-check'
import { expect } from 'vitest'
import { apiErrorSchema } from '../../../shared/schemas/error.schema'
import { hashPassword } from '../../../server/auth/password'
import { answerClientErrors } from '../../../server/start'
import { makeTestApp, type TestApp } from '../../helpers/testApp'
import { entryPayload, makePerson, makeTherapist } from '../linkFixtures'
import { encodePart, fuzzBody, fuzzId, fuzzQuery, type FuzzBody } from './fuzzArbitraries'
import { roleFor, type AppRoute, type FuzzRole } from './routeList'

/**
 * Runs per route, counting every kind of generated request (bodies, queries, ids; signed in and anonymous). CI's second
 * pass on PostgreSQL sets FUZZ_RUNS_PER_ROUTE lower to stay inside its time limit; the SQLite pass keeps the full 1 000.
 */
export const RUNS_PER_ROUTE = Number(process.env.FUZZ_RUNS_PER_ROUTE ?? 1_000)
if (!Number.isInteger(RUNS_PER_ROUTE) || RUNS_PER_ROUTE < 1) throw new Error(`FUZZ_RUNS_PER_ROUTE must be a whole number ≥ 1, not ${process.env.FUZZ_RUNS_PER_ROUTE}`)

/** A cookie jar and CSRF token over keep-alive fetch; follows the server's Set-Cookie and any new csrfToken. */
export class Session {
  private cookies = new Map<string, string>()
  token = ''
  constructor(private base: string) {}

  static async open(base: string): Promise<Session> {
    const s = new Session(base)
    const res = await s.send('GET', '/api/auth/csrf')
    expect(res.status).toBe(200)
    return s
  }

  static async signedIn(base: string, email: string, password: string): Promise<Session> {
    const s = await Session.open(base)
    const res = await s.send('POST', '/api/auth/signin', { kind: 'json', text: JSON.stringify({ email, password }) })
    expect(res.status).toBe(200)
    return s
  }

  async send(method: string, pathAndQuery: string, body: FuzzBody = { kind: 'none' }): Promise<{ status: number; text: string; json: unknown }> {
    const headers: Record<string, string> = { 'x-csrf-token': this.token }
    if (this.cookies.size) headers.cookie = [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; ')
    let payload: string | FormData | undefined
    const canHaveBody = method !== 'GET' && method !== 'HEAD'
    if (canHaveBody && body.kind === 'json') {
      headers['content-type'] = 'application/json'
      payload = body.text
    } else if (canHaveBody && (body.kind === 'raw' || body.kind === 'form')) {
      headers['content-type'] = body.contentType ?? 'text/plain'
      payload = body.text
    } else if (canHaveBody && body.kind === 'multipart') {
      const form = new FormData()
      form.append('file', new Blob([body.text ?? ''], { type: 'text/csv' }), 'scores.csv')
      payload = form
    }
    const res = await fetch(this.base + pathAndQuery, { method, headers, body: payload })
    for (const line of res.headers.getSetCookie()) {
      const [pair] = line.split(';')
      const eq = pair!.indexOf('=')
      this.cookies.set(pair!.slice(0, eq), pair!.slice(eq + 1))
    }
    const text = await res.text()
    let json: unknown
    try { json = JSON.parse(text) } catch { json = undefined }
    const token = (json as { csrfToken?: unknown } | undefined)?.csrfToken
    if (typeof token === 'string') this.token = token
    return { status: res.status, text, json }
  }
}

export interface FuzzServer {
  t: TestApp
  base: string
  close(): Promise<void>
}

/** One test app per fuzz file, listening once on loopback; limits raised so the fuzzer reaches the validation. */
export async function startFuzzServer(): Promise<FuzzServer> {
  const t = await makeTestApp({ SIGNIN_LIMIT: '1000000', RESET_LIMIT: '1000000' })
  const server = http.createServer(t.app)
  answerClientErrors(server)
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve))
  const base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`
  return {
    t,
    base,
    async close() {
      server.closeAllConnections()
      await new Promise<void>((resolve) => server.close(() => resolve()))
      await t.close()
    },
  }
}

/** Fresh people for one route, so what one route's fuzzing changes (an ended link, a disabled account) stays there. */
export interface Fixture {
  sessions: Record<FuzzRole | 'anonymous', Session>
  ids: Record<string, string[]>
  templates: Record<string, object[]>
  secretBody: string
}

export async function makeFixture(s: FuzzServer): Promise<Fixture> {
  const { t, base } = s
  const person = await makePerson(t, 'Fuzz Person')
  const therapist = await makeTherapist(t, 'Fuzz Therapist')
  const adminEmail = `fuzz.admin.${randomUUID().slice(0, 6)}@example.org`
  const admin = await t.deps.models.User.create({ email: adminEmail, passwordHash: await hashPassword(person.password, t.deps.config.scryptCost), role: 'admin', displayName: 'Fuzz Admin', emailVerifiedAt: new Date(), disabledAt: null })
  const sessions: Fixture['sessions'] = {
    person: await Session.signedIn(base, person.email, person.password),
    therapist: await Session.signedIn(base, therapist.email, therapist.password),
    admin: await Session.signedIn(base, adminEmail, person.password),
    anonymous: await Session.open(base),
  }
  const json = (v: object): FuzzBody => ({ kind: 'json', text: JSON.stringify(v) })
  // Made in the database: the code routes' own per-IP limit (20 failures) is soon used up by the fuzzing itself.
  const link = await t.deps.models.Link.create({ personId: person.user.id, therapistId: therapist.user.id, state: 'active', startedAt: new Date(), endedAt: null, endedBy: null })
  const linkId = link.id
  const code = 'ZZZZ-ZZZZ'
  const entryId = randomUUID()
  const secretBody = `fuzz-secret-${randomUUID()}`
  expect((await sessions.person.send('PUT', `/api/links/${linkId}/shares/${entryId}`, json({ version: 1, payload: entryPayload(entryId, 1, secretBody) }))).status).toBe(200)
  const note = await sessions.therapist.send('POST', `/api/therapist/links/${linkId}/notes`, json({ text: 'fuzz note' }))
  const noteId = (note.json as { note: { id: string } }).note.id
  const earlier = await sessions.therapist.send('POST', `/api/therapist/links/${linkId}/earlier-scores`, { kind: 'multipart', text: 'date,measure,total\n2026-08-03,PHQ-9,17\n' })
  expect(earlier.status).toBe(201)
  const earlierId = (earlier.json as { scores: { id: string }[] }).scores[0]!.id
  const userIds = [person.user.id, therapist.user.id, admin.id]

  const entry = (v: number) => entryPayload(entryId, v, 'fuzz')
  const templates: Record<string, object[]> = {
    'POST /api/auth/signup': [
      { role: 'person', email: `new.${randomUUID().slice(0, 6)}@example.org`, password: 'a long enough password', displayName: 'New One' },
      { role: 'therapist', email: `new.${randomUUID().slice(0, 6)}@example.org`, password: 'a long enough password', displayName: 'New One', practice: 'Invented Rooms', registration: 'Demo no. 1' },
    ],
    'POST /api/auth/signin': [{ email: person.email, password: person.password }, { email: person.email, password: 'wrong password here' }],
    'POST /api/auth/verify': [{ token: 'A'.repeat(43) }],
    'POST /api/auth/reset/request': [{ email: person.email }],
    'POST /api/auth/reset': [{ token: 'A'.repeat(43), password: 'a long enough password' }],
    'PATCH /api/person/preferences': [{ displayName: 'Renamed', emailNotices: false }],
    'PATCH /api/therapist/preferences': [{ displayName: 'Renamed', emailNotices: false }],
    'PATCH /api/therapist/profile': [{ practice: 'Other Rooms', registration: 'Demo no. 2' }],
    'PATCH /api/admin/accounts/:id': [{ disabled: false }],
    'POST /api/admin/approvals/:id': [{ checks: ['registration'], note: 'ok' }],
    'POST /api/therapist/invitations': [{}, { email: 'invitee@example.org' }],
    'POST /api/person/links/preview': [{ code }, { code: 'ZZZZ-ZZZZ' }],
    'POST /api/person/links': [{ code: 'ZZZZ-ZZZZ' }],
    'POST /api/therapist/links/:linkId/appointments': [{ at: '2027-05-05T10:00:00Z' }],
    'PUT /api/links/:linkId/shares/:entryId': [{ version: 2, payload: entry(2) }, { version: 3, payload: { ...entry(3), kind: 'tug' } }],
    'PATCH /api/therapist/links/:linkId/shares/:entryId': [{ read: true, toDiscuss: true }],
    'POST /api/therapist/links/:linkId/notes': [{ text: 'a note' }],
    'PATCH /api/therapist/links/:linkId/notes/:noteId': [{ text: 'an edited note' }],
  }
  const ids: Record<string, string[]> = { linkId: [linkId], entryId: [entryId], noteId: [noteId], id: [earlierId, ...userIds] }
  return { sessions, ids, templates, secretBody }
}

// A stack frame names a file, e.g. `at fn (/app/x.js:1:2)`; plain words like “at most … 02:16:47” are not one.
const SERVER_DETAILS = /\bat (?:[\w$.<>\[\] ]+ \()?(?:\/|file:|node:)[^\s\"]*:\d+:\d+|node_modules|\/server\/|\.ts:\d+|SQLITE_|\bSELECT\b.+\bFROM\b|\bINSERT INTO\b|Sequelize/

/** Checks one answer: never 5xx, every 4xx in the shared error shape, no stack or SQL in any body. */
export function checkAnswer(route: AppRoute, sent: string, res: { status: number; text: string; json: unknown }) {
  const where = `${route.method} ${sent.slice(0, 300)} -> ${res.status} ${res.text.slice(0, 300)}`
  if (res.status >= 500) throw new Error(`server error: ${where}`)
  if (res.status >= 400 && !apiErrorSchema.safeParse(res.json).success) throw new Error(`4xx not in the error shape: ${where}`)
  if (SERVER_DETAILS.test(res.text) && res.status >= 400) throw new Error(`server details in an error body: ${where}`)
}

const paramNames = (path: string) => [...path.matchAll(/:(\w+)/g)].map((m) => m[1]!)

/** Requests in flight at once: SQLite reads run in libuv's pool, so a few overlap while the app thread works. */
const CONCURRENCY = 2

/**
 * Fuzzes one route: RUNS_PER_ROUTE requests, four in five as the role that can reach it, one in five anonymously.
 * Cases come from fast-check with a printed seed (FUZZ_SEED=<n> replays a run) and are sent a few at a time.
 */
export async function fuzzRoute(s: FuzzServer, route: AppRoute, seed: number): Promise<{ statuses: Record<number, number>; failures: string[] }> {
  const fx = await makeFixture(s)
  const key = `${route.method} ${route.path}`
  const names = paramNames(route.path)
  const role = roleFor(route)
  const statuses: Record<number, number> = {}
  const failures: string[] = []
  const arb = fc.record({
    as: fc.constantFrom<FuzzRole | 'anonymous'>(role, role, role, role, 'anonymous'),
    params: fc.tuple(...names.map((n) => fuzzId(fx.ids[n] ?? [])), fc.constant('')),
    query: fuzzQuery,
    body: fuzzBody(fx.templates[key] ?? []),
  })
  const cases = fc.sample(arb, { numRuns: RUNS_PER_ROUTE, seed })
  let next = 0
  const worker = async () => {
    while (next < cases.length) {
      const c = cases[next++]!
      let path = route.path
      names.forEach((n, i) => { path = path.replace(`:${n}`, encodePart(c.params[i]!)) })
      const query = c.query.map(([k, v]) => `${encodePart(k)}=${encodePart(v)}`).join('&')
      const sent = path + (query ? `?${query}` : '')
      try {
        const res = await fx.sessions[c.as].send(route.method, sent, c.body)
        statuses[res.status] = (statuses[res.status] ?? 0) + 1
        checkAnswer(route, sent, res)
      } catch (err) {
        failures.push(`${c.as} ${c.body.kind} ${(c.body.text ?? '').slice(0, 200)}: ${err instanceof Error ? err.message : String(err)}`)
      }
    }
  }
  await Promise.all(Array.from({ length: CONCURRENCY }, worker))
  return { statuses, failures }
}

/** Object.prototype's own keys, to compare before and after. */
export const prototypeKeys = () => Object.getOwnPropertyNames(Object.prototype).sort()
