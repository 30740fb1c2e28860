import { randomUUID } from 'node:crypto'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { makeTestApp, type TestApp } from '../helpers/testApp'
import { demo, put } from './linkFixtures'

let t: TestApp
beforeAll(async () => { t = await makeTestApp() })
afterAll(async () => { await t.close() })

describe('concurrent writes on one SQLite file', () => {
  it('answers every one of many simultaneous shares and reads without a 500', async () => {
    const person = await demo(t, 'person')
    const therapist = await demo(t, 'therapist')
    const linkId = (await person.get('/api/person/links')).body.links[0].id as string
    const ids = Array.from({ length: 40 }, () => randomUUID())
    // Shares write, and reads write audit rows: both run transactions at the same moment.
    const results = await Promise.all([
      ...ids.map((id) => put(person, linkId, id, 1, `note ${id.slice(0, 4)}`)),
      ...Array.from({ length: 20 }, () => therapist.get(`/api/therapist/links/${linkId}/shares`)),
    ])
    expect(results.map((r) => r.status).filter((s) => s >= 500)).toEqual([])
    expect(await t.deps.models.SharedEntry.count({ where: { linkId } })).toBe(40)
  })
})
