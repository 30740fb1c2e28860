import { randomUUID } from 'node:crypto'
import { expect } from 'vitest'
import type { Entry } from '../../shared/schemas/entry.schema'
import { hashPassword } from '../../server/auth/password'
import { demoAccounts } from '../../server/db/seed'
import { agentWithCsrf, type TestApp } from '../helpers/testApp'

export type Agent = Awaited<ReturnType<typeof agentWithCsrf>>

const PASSWORD = 'fixture-password-meadow'

/** A person account made straight in the database, so each test can have people with no links yet. */
export async function makePerson(t: TestApp, displayName: string, opts: { verified?: boolean; emailNotices?: boolean } = {}) {
  const email = `${displayName.toLowerCase().replace(/\W+/g, '.')}.${randomUUID().slice(0, 6)}@example.org`
  const user = await t.deps.models.User.create({
    email,
    passwordHash: await hashPassword(PASSWORD, t.deps.config.scryptCost),
    role: 'person',
    displayName,
    emailVerifiedAt: opts.verified === false ? null : new Date(),
    emailNotices: opts.emailNotices ?? true,
    disabledAt: null,
  })
  return { user, email, password: PASSWORD }
}

export async function makeTherapist(t: TestApp, displayName: string, opts: { approved?: boolean } = {}) {
  const email = `${displayName.toLowerCase().replace(/\W+/g, '.')}.${randomUUID().slice(0, 6)}@example.org`
  const admin = await t.deps.models.User.findOne({ where: { email: demoAccounts.admin.email } })
  const user = await t.deps.models.User.create({
    email,
    passwordHash: await hashPassword(PASSWORD, t.deps.config.scryptCost),
    role: 'therapist',
    displayName,
    emailVerifiedAt: new Date(),
    disabledAt: null,
  })
  const approved = opts.approved ?? true
  await t.deps.models.TherapistProfile.create({
    userId: user.id,
    practice: 'Brookvale Rooms (invented)',
    registration: `Demo register no. BV-${randomUUID().slice(0, 5)}`,
    approvedAt: approved ? new Date() : null,
    approvedById: approved ? admin!.id : null,
    approvalChecks: approved ? JSON.stringify(['registration']) : null,
    approvalNote: null,
  })
  return { user, email, password: PASSWORD }
}

export async function signedInAs(t: TestApp, who: { email: string; password: string }): Promise<Agent> {
  const a = await agentWithCsrf(t.app)
  const res = await a.signIn(who.email, who.password)
  expect(res.status).toBe(200)
  return a
}

export const demo = (t: TestApp, who: keyof typeof demoAccounts) => signedInAs(t, demoAccounts[who])

/** Invitation, then confirmation: returns the new active link's id. */
export async function linkUp(therapist: Agent, person: Agent): Promise<string> {
  const inv = await therapist.post('/api/therapist/invitations', {})
  expect(inv.status).toBe(201)
  const res = await person.post('/api/person/links', { code: inv.body.code })
  expect(res.status).toBe(201)
  return res.body.link.id as string
}

/** A valid shared payload whose text fields all carry `marker`, so a test can search any response body for it. */
export function entryPayload(id: string, version: number, marker: string, extra: Partial<Entry> = {}): Entry {
  return {
    id,
    kind: 'moment',
    createdAt: 1_764_000_000_000,
    updatedAt: 1_764_000_000_000 + version,
    version,
    body: `${marker} body`,
    wants: [{ text: `${marker} want`, importance: 6, ladder: [{ id: 'r1', text: `${marker} rung` }] }],
    backgroundThoughts: [`${marker} thought`],
    tags: ['work'],
    shares: [{ linkId: randomUUID(), state: 'shared', sentVersion: version }],
    ...extra,
  }
}

export function put(person: Agent, linkId: string, entryId: string, version: number, marker: string, extra: Partial<Entry> = {}) {
  return person.agent
    .put(`/api/links/${linkId}/shares/${entryId}`)
    .set('x-csrf-token', person.token)
    .send({ version, payload: entryPayload(entryId, version, marker, extra) })
}
