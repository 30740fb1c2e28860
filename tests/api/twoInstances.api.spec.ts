import { randomUUID } from 'node:crypto'
import { Op } from 'sequelize'
import supertest from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import fs from 'node:fs'
import os from 'node:os'
import path from 'node:path'
import { databaseTarget, loadConfig } from '../../server/config/env'
import { migrator } from '../../server/db/migrations'
import { prepareDatabase } from '../../server/db/prepareDatabase'
import { demoAccounts } from '../../server/db/seed'
import { openDatabase } from '../../server/db/sequelize'
import { freshDatabase, makeTestApp, type TestApp } from '../helpers/testApp'
import { entryPayload, linkUp, makePerson, makeTherapist, put, signedInAs } from './linkFixtures'

// Two app instances on one database, as behind a load balancer: a SQLite file normally, a PostgreSQL database when
// TEST_DATABASE_URL is set. Instances share SESSION_SECRET, as production requires.
const env = { SESSION_SECRET: 'one-secret-for-every-instance-of-rungs-x', SIGNIN_LIMIT: '3' }
let a: TestApp
let b: TestApp
beforeAll(async () => {
  a = await makeTestApp(env)
  b = await makeTestApp({ ...env, DATABASE_URL: a.databaseUrl })
})
afterAll(async () => {
  await b?.close()
  await a?.close()
})

/** A sign-in by hand, so its cookie can be carried to the other instance. */
async function signInOn(t: TestApp, email: string, password: string) {
  const first = await supertest(t.app).get('/api/auth/csrf').expect(200)
  const cookie = first.get('Set-Cookie')!.map((c) => c.split(';')[0]).join('; ')
  const res = await supertest(t.app).post('/api/auth/signin').set('Cookie', cookie).set('x-csrf-token', first.body.csrfToken).send({ email, password })
  const signedIn = res.get('Set-Cookie')?.map((c) => c.split(';')[0]).join('; ')
  return { res, cookie: signedIn ?? cookie, token: res.body.csrfToken as string | undefined }
}

describe('two instances on one database', () => {
  it('share the sign-in limit: failures on either count together, and the 4th answer is 429 from the other', async () => {
    const p = await makePerson(a, 'Quinn Harlow')
    expect((await signInOn(a, p.email, 'wrong password one')).res.status).toBe(401)
    expect((await signInOn(b, p.email, 'wrong password two')).res.status).toBe(401)
    expect((await signInOn(a, p.email, 'wrong password three')).res.status).toBe(401)
    const fourth = await signInOn(b, p.email, p.password)
    expect(fourth.res.status).toBe(429)
    expect(fourth.res.body.error.code).toBe('rate_limited')

    const rows = await a.deps.models.RateLimitCounter.findAll({ where: { key: { [Op.startsWith]: 'signin:' } } })
    expect(rows).toHaveLength(1)
    expect(rows[0]!.hits).toBe(4)
    // The address is kept only as a hash.
    expect(rows[0]!.key).toMatch(/^signin:[0-9a-f]{64}$/)
    expect(await a.deps.models.Session.count({ where: { userId: p.user.id } })).toBe(0)
  })

  it('need no sticky sessions: a session made on one instance works on the other, and signing out there ends it', async () => {
    const p = await makePerson(b, 'Rowan Vesey')
    // The test before used up this address's sign-in allowance: start a new window.
    await a.deps.models.RateLimitCounter.destroy({ where: {} })
    const { res, cookie, token } = await signInOn(a, p.email, p.password)
    expect(res.status).toBe(200)
    const me = await supertest(b.app).get('/api/me').set('Cookie', cookie)
    expect(me.status).toBe(200)
    expect(me.body.user.email).toBe(p.email)
    expect(await b.deps.models.Session.count({ where: { userId: p.user.id } })).toBe(1)

    const out = await supertest(b.app).post('/api/auth/signout').set('Cookie', cookie).set('x-csrf-token', token!).send({})
    expect(out.status).toBe(200)
    expect((await supertest(a.app).get('/api/me').set('Cookie', cookie)).status).toBe(401)
    expect(await a.deps.models.Session.count({ where: { userId: p.user.id } })).toBe(0)
  })

  it('show a share stored through one instance to the therapist reading through the other', async () => {
    await a.deps.models.RateLimitCounter.destroy({ where: {} })
    const th = await makeTherapist(a, 'Sasha Brennick')
    const p = await makePerson(a, 'Tamsin Orrell')
    const person = await signedInAs(a, p)
    const therapist = await signedInAs(b, th)
    // The invitation is made on one instance and used on the other.
    const linkId = await linkUp(therapist, person)
    const entryId = randomUUID()
    expect((await put(person, linkId, entryId, 1, 'lantern-on-the-quay')).body).toEqual({ status: 'stored', version: 1 })

    const read = await therapist.get(`/api/therapist/links/${linkId}/shares`)
    expect(read.status).toBe(200)
    expect(JSON.stringify(read.body)).toContain('lantern-on-the-quay body')
    expect(await b.deps.models.SharedEntry.count({ where: { linkId, entryId } })).toBe(1)
    expect(await a.deps.models.AuditEvent.count({ where: { action: 'shares.read', subjectUserId: p.user.id } })).toBe(1)
  })

  it('store each of many simultaneous PUTs of one entry through both instances exactly once, without a 500', async () => {
    await a.deps.models.RateLimitCounter.destroy({ where: {} })
    const th = await makeTherapist(a, 'Uma Castell')
    const p = await makePerson(a, 'Vale Morrow')
    const therapist = await signedInAs(a, th)
    const onA = await signedInAs(a, p)
    const onB = await signedInAs(b, p)
    const linkId = await linkUp(therapist, onA)
    const ids = Array.from({ length: 8 }, () => randomUUID())
    // Each entry is sent through both instances at once, at the same version: one must store, the other find it stored.
    const answers = await Promise.all(ids.flatMap((id) => [put(onA, linkId, id, 1, 'tide-line'), put(onB, linkId, id, 1, 'tide-line')]))
    expect(answers.map((r) => r.status)).toEqual(answers.map(() => 200))
    for (let i = 0; i < ids.length; i++) {
      const pairOf = [answers[2 * i]!.body.status, answers[2 * i + 1]!.body.status].sort()
      expect(pairOf).toEqual(['stored', 'unchanged'])
    }
    expect(await a.deps.models.SharedEntry.count({ where: { linkId } })).toBe(ids.length)

    // A withdrawal through one and a newer version through the other, at once: whichever lands last wins, and the
    // tombstone never loses its version.
    const [withdrawn, newer] = await Promise.all([
      onA.del(`/api/links/${linkId}/shares/${ids[0]}?version=2`),
      onB.agent.put(`/api/links/${linkId}/shares/${ids[0]}`).set('x-csrf-token', onB.token).send({ version: 3, payload: entryPayload(ids[0]!, 3, 'tide-line') }),
    ])
    expect([withdrawn.status, newer.status]).toEqual([200, 200])
    const row = await b.deps.models.SharedEntry.findOne({ where: { linkId, entryId: ids[0] } })
    expect(row!.version).toBe(3)
    expect(await b.deps.models.SharedEntry.count({ where: { linkId, entryId: ids[0] } })).toBe(1)
  })
})

describe('two instances starting at once on an empty database', () => {
  it('apply each migration once between them and seed the demo once', async () => {
    const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'rungs-start-'))
    const database = await freshDatabase(dataDir)
    const target = databaseTarget(loadConfig({ NODE_ENV: 'test', DATA_DIR: dataDir, DATABASE_URL: database.url }))
    const [one, two] = await Promise.all([openDatabase(target), openDatabase(target)])
    try {
      const every = (await migrator(one).pending()).map((m) => m.name)
      expect(every.length).toBeGreaterThan(0)
      const opts = { seedDemo: true, scryptCost: 1024 }
      const [first, second] = await Promise.all([prepareDatabase(one, opts), prepareDatabase(two, opts)])
      expect([...first.applied, ...second.applied].sort()).toEqual([...every].sort())
      expect([first.seeded, second.seeded].sort()).toEqual([false, true])
      const [rows] = await one.query('SELECT name FROM schema_migrations')
      expect(rows).toHaveLength(every.length)
      expect(await first.models.User.count()).toBe(Object.keys(demoAccounts).length)
    } finally {
      await one.close()
      await two.close()
      await database.drop()
      fs.rmSync(dataDir, { recursive: true, force: true })
    }
  })
})
