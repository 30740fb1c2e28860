import { randomUUID } from 'node:crypto'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { agentWithCsrf, makeTestApp, type TestApp } from '../helpers/testApp'
import { entryPayload, linkUp, makePerson, makeTherapist, signedInAs } from './linkFixtures'

// PostgreSQL cannot store U+0000 in text (Sequelize would write it there as a backslash and a zero; SQLite keeps it):
// so the same text is refused at the boundary on every database, with a 400.
let t: TestApp
beforeAll(async () => { t = await makeTestApp() })
afterAll(async () => { await t.close() })

describe('text holding U+0000', () => {
  it('is refused in a sign-up with 400 invalid_input naming the field, and no account is made', async () => {
    const a = await agentWithCsrf(t.app)
    const email = 'nul.signup@example.org'
    const res = await a.post('/api/auth/signup', { role: 'person', email, password: 'a long enough passphrase', displayName: 'Sam\u0000' })
    expect(res.status).toBe(400)
    expect(res.body.error.code).toBe('invalid_input')
    expect(res.body.error.details[0].path).toEqual(['body', 'displayName'])
    expect(await t.deps.models.User.count({ where: { email } })).toBe(0)
  })

  it('is refused in a prep note, and the note is not stored', async () => {
    const therapist = await signedInAs(t, await makeTherapist(t, 'Wren Halloway'))
    const person = await signedInAs(t, await makePerson(t, 'Xan Pellow'))
    const linkId = await linkUp(therapist, person)
    const res = await therapist.post(`/api/therapist/links/${linkId}/notes`, { text: 'before\u0000after' })
    expect(res.status).toBe(400)
    expect(res.body.error.code).toBe('invalid_input')
    expect(await t.deps.models.PrepNote.count({ where: { linkId } })).toBe(0)
    expect((await therapist.post(`/api/therapist/links/${linkId}/notes`, { text: 'before and after' })).status).toBe(201)
  })

  it('is kept in a shared entry, whose stored JSON escapes it, and reads back the same', async () => {
    const therapist = await signedInAs(t, await makeTherapist(t, 'Yara Whitcombe'))
    const person = await signedInAs(t, await makePerson(t, 'Zed Amberley'))
    const linkId = await linkUp(therapist, person)
    const id = randomUUID()
    const payload = entryPayload(id, 1, 'pasted', { body: 'pasted\u0000text' })
    const res = await person.agent.put(`/api/links/${linkId}/shares/${id}`).set('x-csrf-token', person.token).send({ version: 1, payload })
    expect(res.status).toBe(200)
    const row = await t.deps.models.SharedEntry.findOne({ where: { linkId, entryId: id } })
    expect(JSON.parse(row!.payload!).body).toBe('pasted\u0000text')
  })
})
