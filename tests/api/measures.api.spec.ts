import { randomUUID } from 'node:crypto'
import { parse } from 'csv-parse/sync'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Entry } from '../../shared/schemas/entry.schema'
import { earlierScoresResponseSchema, linkMeasuresSchema } from '../../shared/schemas/measureReport.schema'
import { caseloadRowSchema } from '../../shared/schemas/prep.schema'
import { makeTestApp, type TestApp } from '../helpers/testApp'
import { linkUp, makePerson, makeTherapist, put, signedInAs, type Agent } from './linkFixtures'

let t: TestApp
beforeAll(async () => { t = await makeTestApp() })
afterAll(async () => { await t.close() })

const DAY = 86_400_000
const T0 = Date.UTC(2026, 8, 14, 9) // 14 Sep 2026

async function pair(name: string) {
  const th = await makeTherapist(t, 'Idris Vane')
  const p = await makePerson(t, name)
  const therapist = await signedInAs(t, th)
  const person = await signedInAs(t, p)
  const linkId = await linkUp(therapist, person)
  return { th, p, therapist, person, linkId }
}

function measureExtra(instrument: 'phq9' | 'gad7', answers: (0 | 1 | 2 | 3 | null)[], at: number): Partial<Entry> {
  return { kind: 'measure', createdAt: at, body: '', wants: [], backgroundThoughts: [], tags: [], measure: { instrument, answers, completedAt: at } }
}
const shareMeasure = (person: Agent, linkId: string, instrument: 'phq9' | 'gad7', answers: (0 | 1 | 2 | 3 | null)[], at: number) =>
  put(person, linkId, randomUUID(), 1, 'm', measureExtra(instrument, answers, at))

const upload = (a: Agent, linkId: string, text: string | Buffer, opts: { filename?: string; contentType?: string } = {}) =>
  a.agent
    .post(`/api/therapist/links/${linkId}/earlier-scores`)
    .set('x-csrf-token', a.token)
    .attach('file', Buffer.isBuffer(text) ? text : Buffer.from(text), { filename: opts.filename ?? 'earlier.csv', contentType: opts.contentType ?? 'text/csv' })

const earlierCount = (linkId: string) => t.deps.models.EarlierScore.count({ where: { linkId } })
const caseloadRow = async (a: Agent, linkId: string) => {
  const res = await a.get('/api/therapist/caseload')
  expect(res.status).toBe(200)
  return caseloadRowSchema.parse(res.body.caseload.find((r: { linkId: string }) => r.linkId === linkId))
}

describe('GET /api/therapist/links/:linkId/measures', () => {
  it('scores a shared PHQ-9 from its raw answers and writes one access-log row for it', async () => {
    const { therapist, person, linkId, p } = await pair('Quill')
    // US Core phq-9-example: [2,2,2,2,1,1,2,0,0] → 12 moderate (REFERENCE check value 1)
    const shared = await shareMeasure(person, linkId, 'phq9', [2, 2, 2, 2, 1, 1, 2, 0, 0], T0)
    expect(shared.status).toBe(200)
    const row = await t.deps.models.SharedEntry.findOne({ where: { linkId, kind: 'measure' } })
    expect(row!.riskFlag).toBe(false)

    const res = await therapist.get(`/api/therapist/links/${linkId}/measures`)
    expect(res.status).toBe(200)
    expect(res.headers['cache-control']).toBe('no-store')
    const body = linkMeasuresSchema.parse(res.body)
    expect(body.results).toHaveLength(1)
    expect(body.results[0]).toMatchObject({ instrument: 'phq9', total: 12, band: 'moderate', source: 'person', selfHarm: 'none' })
    expect(body.outcome).toBeNull() // one score is not a course
    expect(body.changes).toEqual({})
    expect(await t.deps.models.AuditEvent.count({ where: { action: 'shares.read', subjectUserId: p.user.id, subjectId: row!.id } })).toBe(1)
  })

  it('never trusts a total stored in the payload', async () => {
    const { therapist, person, linkId } = await pair('Rook')
    const id = randomUUID()
    const extra = measureExtra('gad7', [1, 1, 1, 1, 0, 1, 2], T0) as Partial<Entry> & { total?: number }
    await person.agent.put(`/api/links/${linkId}/shares/${id}`).set('x-csrf-token', person.token).send({ version: 1, payload: { id, version: 1, updatedAt: T0, shares: [], ...extra, total: 21 } })
    const body = linkMeasuresSchema.parse((await therapist.get(`/api/therapist/links/${linkId}/measures`)).body)
    // PACIO sample: [1,1,1,1,0,1,2] → 7 mild (REFERENCE check value 5)
    expect(body.results.map((r) => [r.total, r.band])).toEqual([[7, 'mild']])
  })

  it('classifies a course by the Talking Therapies rules once a measure has two scores', async () => {
    const { therapist, person, linkId } = await pair('Sorrel')
    // REFERENCE row 13: PHQ-9 15→8, GAD-7 12→6 → recovery, reliable improvement, reliable recovery
    await shareMeasure(person, linkId, 'phq9', [2, 2, 2, 2, 2, 2, 2, 1, 0], T0)
    await shareMeasure(person, linkId, 'gad7', [2, 2, 2, 2, 2, 1, 1], T0)
    await shareMeasure(person, linkId, 'phq9', [1, 1, 1, 1, 1, 1, 1, 1, 0], T0 + 42 * DAY)
    await shareMeasure(person, linkId, 'gad7', [1, 1, 1, 1, 1, 1, 0], T0 + 42 * DAY)
    const body = linkMeasuresSchema.parse((await therapist.get(`/api/therapist/links/${linkId}/measures`)).body)
    expect(body.results.map((r) => r.takenAt.slice(0, 10))).toEqual(['2026-09-14', '2026-09-14', '2026-10-26', '2026-10-26'])
    expect(body.results.filter((r) => r.instrument === 'phq9').map((r) => r.total)).toEqual([15, 8])
    expect(body.results.filter((r) => r.instrument === 'gad7').map((r) => r.total)).toEqual([12, 6])
    expect(body.outcome).toMatchObject({ casenessAtStart: true, casenessAtEnd: false, recovery: true, reliableImprovement: true, reliableRecovery: true, reliableDeterioration: false })
    expect(body.changes).toEqual({ phq9: 'reliable improvement', gad7: 'reliable improvement' })
  })
})

describe('caseload measure columns', () => {
  it('shows the latest score, band and change since the first, and flags a PHQ-9 with item 9 above 0', async () => {
    const { therapist, person, linkId, p } = await pair('Tamsin')
    expect((await caseloadRow(therapist, linkId)).measures).toEqual({ phq9: null, gad7: null })

    await shareMeasure(person, linkId, 'phq9', [2, 2, 2, 2, 2, 2, 2, 2, 1], T0) // 17, item 9 = 1
    const flagged = await t.deps.models.SharedEntry.findOne({ where: { linkId, kind: 'measure' } })
    expect(flagged!.riskFlag).toBe(true)
    await shareMeasure(person, linkId, 'phq9', [1, 1, 1, 1, 1, 1, 1, 1, 0], T0 + 14 * DAY) // 8
    await shareMeasure(person, linkId, 'gad7', [1, 1, 1, 1, 0, 1, 2], T0 + 14 * DAY) // 7

    const before = await t.deps.models.AuditEvent.count({ where: { action: 'shares.read', subjectUserId: p.user.id } })
    const row = await caseloadRow(therapist, linkId)
    expect(row.riskFlag).toBe(true)
    expect(row.measures.phq9).toMatchObject({ latest: 8, band: 'mild', changeSinceFirst: -9, source: 'person' })
    expect(row.measures.gad7).toMatchObject({ latest: 7, band: 'mild', changeSinceFirst: null, source: 'person' })
    // The three shared copies behind the summaries (PHQ-9 first and latest, GAD-7 latest) are logged as opened.
    expect(await t.deps.models.AuditEvent.count({ where: { action: 'shares.read', subjectUserId: p.user.id } })).toBe(before + 3)
  })
})

describe('stored scores and the caseload access log', () => {
  const columns = (r: { measureInstrument: string | null; measureTotal: number | null; measureBand: string | null; measureTakenAt: Date | null } | null) =>
    r && [r.measureInstrument, r.measureTotal, r.measureBand, r.measureTakenAt?.toISOString() ?? null]

  it('stores the score the server computed from the answers, never the device\'s, and drops it with the payload', async () => {
    const { person, linkId } = await pair('Umber')
    const id = randomUUID()
    const extra = measureExtra('gad7', [1, 1, 1, 1, 0, 1, 2], T0) as Partial<Entry> & { total?: number; band?: string }
    await person.agent.put(`/api/links/${linkId}/shares/${id}`).set('x-csrf-token', person.token).send({ version: 1, payload: { id, version: 1, updatedAt: T0, shares: [], ...extra, total: 21, band: 'severe' } }).expect(200)
    // PACIO sample: [1,1,1,1,0,1,2] → 7 mild (REFERENCE check value 5)
    expect(columns(await t.deps.models.SharedEntry.findOne({ where: { linkId, entryId: id } }))).toEqual(['gad7', 7, 'mild', new Date(T0).toISOString()])
    const moment = randomUUID()
    await put(person, linkId, moment, 1, 'not-a-measure')
    expect(columns(await t.deps.models.SharedEntry.findOne({ where: { linkId, entryId: moment } }))).toEqual([null, null, null, null])

    await person.del(`/api/links/${linkId}/shares/${id}?version=1`).expect(200)
    expect(columns(await t.deps.models.SharedEntry.findOne({ where: { linkId, entryId: id } }))).toEqual([null, null, null, null])
  })

  it('drops every stored score when the link ends', async () => {
    const { person, linkId } = await pair('Vetch')
    await shareMeasure(person, linkId, 'phq9', [2, 2, 2, 2, 1, 1, 2, 0, 0], T0)
    expect(await t.deps.models.SharedEntry.count({ where: { linkId, measureTotal: 12 } })).toBe(1)
    await person.post(`/api/links/${linkId}/end`).expect(200)
    const rows = await t.deps.models.SharedEntry.findAll({ where: { linkId } })
    expect(rows.map((r) => [r.payload, ...columns(r)!])).toEqual([[null, null, null, null, null]])
  })

  it('scores a copy stored before the score columns existed from its payload', async () => {
    const { therapist, person, linkId } = await pair('Willow')
    await shareMeasure(person, linkId, 'phq9', [2, 2, 2, 2, 2, 2, 2, 2, 1], T0) // 17
    await shareMeasure(person, linkId, 'phq9', [1, 1, 1, 1, 1, 1, 1, 1, 0], T0 + 14 * DAY) // 8
    const [older] = await t.deps.models.SharedEntry.findAll({ where: { linkId }, order: [['measureTakenAt', 'ASC']] })
    await t.deps.models.SharedEntry.update({ measureInstrument: null, measureTotal: null, measureBand: null, measureTakenAt: null }, { where: { id: older!.id } })
    expect((await caseloadRow(therapist, linkId)).measures.phq9).toMatchObject({ latest: 8, band: 'mild', changeSinceFirst: -9 })
  })

  it('logs the copies behind the caseload once per ten minutes, and again after', async () => {
    let now = new Date('2027-04-01T09:00:00Z')
    t.deps.now = () => now
    try {
      const { th, therapist, person, linkId, p } = await pair('Xanthe')
      await shareMeasure(person, linkId, 'phq9', [2, 2, 2, 2, 2, 2, 2, 2, 1], T0)
      await shareMeasure(person, linkId, 'phq9', [1, 1, 1, 1, 1, 1, 1, 1, 0], T0 + 14 * DAY)
      const reads = () => t.deps.models.AuditEvent.count({ where: { action: 'shares.read', actorId: th.user.id, subjectUserId: p.user.id } })
      await caseloadRow(therapist, linkId)
      expect(await reads()).toBe(2)
      now = new Date(now.getTime() + 9 * 60_000)
      await caseloadRow(therapist, linkId)
      await therapist.get(`/api/therapist/links/${linkId}/measures`).expect(200)
      expect(await reads()).toBe(2)
      now = new Date(now.getTime() + 2 * 60_000)
      await caseloadRow(therapist, linkId)
      expect(await reads()).toBe(4)
      expect((await t.deps.models.AuditEvent.findAll({ where: { action: 'shares.read', actorId: th.user.id, at: now } })).length).toBe(2)
    } finally {
      t.deps.now = undefined
    }
  })
})

describe('POST /api/therapist/links/:linkId/earlier-scores', () => {
  it('stores a valid file, marks the rows as entered by the therapist and counts change from the earlier first score', async () => {
    const { therapist, person, linkId, th, p } = await pair('Ulla')
    await shareMeasure(person, linkId, 'phq9', [1, 1, 1, 1, 1, 1, 1, 1, 0], T0) // 8
    const csv = '\uFEFFdate,measure,total,item9\r\n2026-08-03,PHQ-9,16,0\r\n2026-08-03,gad7,12,\r\n\r\n'
    const res = await upload(therapist, linkId, csv)
    expect(res.status).toBe(201)
    const { scores } = earlierScoresResponseSchema.parse(res.body)
    expect(scores.map((s) => [s.instrument, s.takenOn, s.total, s.item9, s.enteredBy])).toEqual([
      ['phq9', '2026-08-03', 16, 0, 'Idris Vane'],
      ['gad7', '2026-08-03', 12, null, 'Idris Vane'],
    ])
    const stored = await t.deps.models.EarlierScore.findAll({ where: { linkId }, order: [['instrument', 'DESC']] })
    expect(stored.map((s) => [s.instrument, s.takenOn, s.total, s.item9, s.enteredById])).toEqual([
      ['phq9', '2026-08-03', 16, 0, th.user.id],
      ['gad7', '2026-08-03', 12, null, th.user.id],
    ])
    expect(await t.deps.models.AuditEvent.count({ where: { action: 'earlierScores.uploaded', subjectId: linkId, subjectUserId: p.user.id } })).toBe(1)

    const body = linkMeasuresSchema.parse((await therapist.get(`/api/therapist/links/${linkId}/measures`)).body)
    expect(body.results).toHaveLength(3)
    expect(body.results.at(-1)).toMatchObject({ instrument: 'phq9', total: 8, source: 'person' })
    expect(body.results.filter((r) => r.instrument === 'phq9').map((r) => [r.total, r.source])).toEqual([[16, 'therapist'], [8, 'person']])
    expect(body.changes.phq9).toBe('reliable improvement') // 16 → 8 is −8, at least the 6 points
    expect(body.outcome).toMatchObject({ casenessAtStart: true, measures: ['phq9'] })
    const row = await caseloadRow(therapist, linkId)
    expect(row.measures.phq9).toMatchObject({ latest: 8, changeSinceFirst: -8, source: 'person' })
    expect(row.measures.gad7).toMatchObject({ latest: 12, band: 'moderate', changeSinceFirst: null, source: 'therapist' })

    const list = earlierScoresResponseSchema.parse((await therapist.get(`/api/therapist/links/${linkId}/earlier-scores`)).body)
    expect(list.scores).toHaveLength(2)
  })

  it('answers a bad file with an error for each bad row and stores nothing', async () => {
    const { therapist, linkId } = await pair('Vesna')
    const csv = [
      'date,measure,total,item9',
      '2026-08-03,PHQ-9,12,0', // fine
      '2026-02-30,PHQ-9,12,', // no such date
      '2026-08-03,BDI-II,12,', // unknown measure
      '2026-08-03,PHQ-9,28,', // above 27
      '2026-08-03,GAD-7,9,1', // item9 on a GAD-7
      '03/08/2026,GAD-7,,', // date format and no total
    ].join('\n')
    const res = await upload(therapist, linkId, csv)
    expect(res.status).toBe(400)
    expect(res.body.error.code).toBe('invalid_csv')
    expect(res.body.error.message).toMatch(/nothing was saved/)
    const rows = res.body.error.details.rows as { row: number; errors: string[] }[]
    expect(rows.map((r) => r.row)).toEqual([3, 4, 5, 6, 7])
    expect(rows[0]!.errors.join(' ')).toMatch(/date does not exist/)
    expect(rows[1]!.errors.join(' ')).toMatch(/PHQ-9 or GAD-7/)
    expect(rows[2]!.errors.join(' ')).toMatch(/at most 27/)
    expect(rows[3]!.errors.join(' ')).toMatch(/item9 belongs to the PHQ-9 only/)
    expect(rows[4]!.errors.join(' ')).toMatch(/YYYY-MM-DD/)
    expect(rows[4]!.errors.join(' ')).toMatch(/whole number/)
    expect(await earlierCount(linkId)).toBe(0)
    expect(await t.deps.models.AuditEvent.count({ where: { action: 'earlierScores.uploaded', subjectId: linkId } })).toBe(0)
  })

  it('requires the header row', async () => {
    const { therapist, linkId } = await pair('Wren')
    const res = await upload(therapist, linkId, '2026-08-03,PHQ-9,12,0\n2026-08-10,PHQ-9,10,0\n')
    expect(res.status).toBe(400)
    expect(res.body.error.code).toBe('invalid_csv')
    expect(res.body.error.details.rows[0].row).toBe(1)
    expect(res.body.error.details.rows[0].errors.join(' ')).toMatch(/first row must name the columns/)
    expect(await earlierCount(linkId)).toBe(0)
  })

  it('refuses a file over the size limit with 413 and one that is not a CSV with 415', async () => {
    const { therapist, linkId } = await pair('Xan')
    const big = `date,measure,total\n${'2026-08-03,PHQ-9,12\n'.repeat(4000)}`
    const tooBig = await upload(therapist, linkId, big)
    expect(tooBig.status).toBe(413)
    expect(tooBig.body.error.code).toBe('too_large')
    const png = await upload(therapist, linkId, Buffer.from([0x89, 0x50, 0x4e, 0x47, 0, 0, 0]), { filename: 'scores.png', contentType: 'image/png' })
    expect(png.status).toBe(415)
    expect(png.body.error.code).toBe('unsupported_type')
    const binaryNamedCsv = await upload(therapist, linkId, Buffer.from([0x50, 0x4b, 0x03, 0x04, 0, 0]), { filename: 'scores.csv', contentType: 'text/csv' })
    expect(binaryNamedCsv.status).toBe(415)
    const plainText = await upload(therapist, linkId, 'date,measure,total\n2026-08-03,PHQ-9,12\n', { filename: 'notes.txt', contentType: 'text/plain' })
    expect(plainText.status).toBe(415)
    expect(await earlierCount(linkId)).toBe(0)
    const plainCsv = await upload(therapist, linkId, 'date,measure,total\n2026-08-03,PHQ-9,12\n', { filename: 'scores.csv', contentType: 'text/plain' })
    expect(plainCsv.status).toBe(201)
    expect(await earlierCount(linkId)).toBe(1)
  })

  it('refuses more than 500 rows', async () => {
    const { therapist, linkId } = await pair('Yara')
    const res = await upload(therapist, linkId, `date,measure,total\n${'2026-08-03,GAD-7,9\n'.repeat(501)}`)
    expect(res.status).toBe(400)
    expect(res.body.error.message).toMatch(/at most 500 rows/)
    expect(await earlierCount(linkId)).toBe(0)
  })
})

describe('DELETE /api/therapist/links/:linkId/earlier-scores/:id', () => {
  it('removes one earlier score and audits it', async () => {
    const { therapist, linkId } = await pair('Zola')
    const { scores } = earlierScoresResponseSchema.parse((await upload(therapist, linkId, 'date,measure,total\n2026-08-03,PHQ-9,12\n2026-08-03,GAD-7,9\n')).body)
    const res = await therapist.del(`/api/therapist/links/${linkId}/earlier-scores/${scores[0]!.id}`)
    expect(res.status).toBe(200)
    expect(await t.deps.models.EarlierScore.findByPk(scores[0]!.id)).toBeNull()
    expect(await earlierCount(linkId)).toBe(1)
    expect(await t.deps.models.AuditEvent.count({ where: { action: 'earlierScores.deleted', subjectId: linkId } })).toBe(1)
    const again = await therapist.del(`/api/therapist/links/${linkId}/earlier-scores/${scores[0]!.id}`)
    expect(again.status).toBe(404)
  })
})

describe('GET /api/therapist/links/:linkId/measures.csv', () => {
  it('exports the history with every cell escaped against formula injection', async () => {
    const { therapist, person, linkId, p } = await pair('Plain Name')
    await upload(therapist, linkId, 'date,measure,total,item9\n2026-08-03,PHQ-9,16,\n')
    await shareMeasure(person, linkId, 'phq9', [1, 1, 1, 1, 1, 1, 1, 1, 1], T0)
    for (const name of ['=HYPERLINK("http://example.invalid/?q=1","open")', '+1', '-2', '@x']) {
      await p.user.update({ displayName: name })
      const res = await therapist.get(`/api/therapist/links/${linkId}/measures.csv`)
      expect(res.status).toBe(200)
      expect(res.headers['content-type']).toMatch(/^text\/csv/)
      expect(res.headers['content-disposition']).toMatch(/^attachment; filename="?rungs-measures-[a-z0-9-]+\.csv"?$/)
      const cells = parse(res.text) as string[][]
      expect(cells[0]).toEqual(['date', 'measure', 'total', 'band', 'source', 'item9', 'person'])
      expect(cells.slice(1)).toEqual([
        ['2026-08-03', 'PHQ-9', '16', 'moderately severe', 'entered by therapist', '', `'${name}`],
        ['2026-09-14', 'PHQ-9', '9', 'mild', 'by the person', '1', `'${name}`],
      ])
      for (const line of res.text.split('\r\n').slice(1).filter(Boolean)) expect(line).not.toMatch(/(^|,)[=+\-@]/)
    }
    expect(await t.deps.models.AuditEvent.count({ where: { action: 'measures.exported.csv', subjectId: linkId } })).toBe(4)
  })
})

describe('GET /api/therapist/links/:linkId/measures/fhir', () => {
  it('downloads a FHIR R4 Bundle of the results', async () => {
    const { therapist, person, linkId } = await pair('Fenna')
    await upload(therapist, linkId, 'date,measure,total\n2026-08-03,GAD-7,12\n')
    await shareMeasure(person, linkId, 'phq9', [2, 2, 2, 2, 1, 1, 2, 0, 0], T0)
    const res = await therapist.agent.get(`/api/therapist/links/${linkId}/measures/fhir`).buffer(true).parse((r, cb) => {
      let data = ''
      r.on('data', (c: Buffer) => (data += c.toString()))
      r.on('end', () => cb(null, data))
    })
    expect(res.status).toBe(200)
    expect(res.headers['content-type']).toMatch(/^application\/fhir\+json/)
    expect(res.headers['content-disposition']).toMatch(/^attachment; filename="?rungs-measures-fenna\.fhir\.json"?$/)
    const bundle = JSON.parse(res.body as string)
    expect(bundle.resourceType).toBe('Bundle')
    const types = bundle.entry.map((e: { resource: { resourceType: string } }) => e.resource.resourceType)
    expect(types.filter((x: string) => x === 'QuestionnaireResponse')).toHaveLength(1) // only the shared form has answers
    expect(types.filter((x: string) => x === 'Observation')).toHaveLength(2)
    // LOINC 44261-6 = PHQ-9 total (REFERENCE §4)
    expect(JSON.stringify(bundle)).toContain('44261-6')
    expect(await t.deps.models.AuditEvent.count({ where: { action: 'measures.exported.fhir', subjectId: linkId } })).toBe(1)
  })
})

describe('GET /api/links/:linkId/earlier-scores (the person)', () => {
  it('answers the person on their own link, and no one else', async () => {
    const { therapist, person, linkId } = await pair('Greer')
    await upload(therapist, linkId, 'date,measure,total,item9\n2026-08-03,PHQ-9,14,0\n')
    const own = await person.get(`/api/links/${linkId}/earlier-scores`)
    expect(own.status).toBe(200)
    expect(Object.keys(own.body)).toEqual(['scores'])
    const { scores } = earlierScoresResponseSchema.parse(own.body)
    expect(scores.map((s) => [s.instrument, s.total, s.item9, s.enteredBy])).toEqual([['phq9', 14, 0, 'Idris Vane']])

    const other = await pair('Hollis')
    const stranger = await other.person.get(`/api/links/${linkId}/earlier-scores`)
    expect(stranger.status).toBe(404)
    expect(JSON.stringify(stranger.body)).not.toContain('14')
    const otherTherapist = await other.therapist.get(`/api/links/${linkId}/earlier-scores`)
    expect(otherTherapist.status).toBe(403)
    const otherTherapistOwnSide = await other.therapist.get(`/api/therapist/links/${linkId}/earlier-scores`)
    expect(otherTherapistOwnSide.status).toBe(404)
    const otherUpload = await upload(other.therapist, linkId, 'date,measure,total\n2026-08-03,PHQ-9,1\n')
    expect(otherUpload.status).toBe(404)
    expect(await earlierCount(linkId)).toBe(1)
  })

  it('answers 404 for a pending link, and removes the earlier scores when the link ends', async () => {
    const { therapist, person, linkId, p } = await pair('Ilse')
    await upload(therapist, linkId, 'date,measure,total\n2026-08-03,PHQ-9,14\n')
    expect(await earlierCount(linkId)).toBe(1)
    const pending = await t.deps.models.Link.create({ personId: p.user.id, therapistId: (await makeTherapist(t, 'Juno Pell')).user.id, state: 'pending', startedAt: null, endedAt: null, endedBy: null })
    expect((await person.get(`/api/links/${pending.id}/earlier-scores`)).status).toBe(404)

    const end = await person.post(`/api/links/${linkId}/end`)
    expect(end.status).toBe(200)
    expect(await earlierCount(linkId)).toBe(0)
    const after = await person.get(`/api/links/${linkId}/earlier-scores`)
    expect(after.status).toBe(200)
    expect(after.body).toEqual({ scores: [] })
    expect((await therapist.get(`/api/therapist/links/${linkId}/measures`)).status).toBe(404)
  })
})
