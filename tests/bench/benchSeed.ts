// Accounts for the server benches, written straight through the models into a data folder before the server starts.
import { randomUUID } from 'node:crypto'
import path from 'node:path'
import { hashPassword } from '../../server/auth/password'
import { initModels } from '../../server/db/associations'
import { migrate } from '../../server/db/migrations'
import { openDatabase } from '../../server/db/sequelize'
import { measureColumnsOf } from '../../server/modules/measures/measureColumns'
import type { Entry } from '../../shared/schemas/entry.schema'

export const BENCH_PASSWORD = 'bench-person-quarry-lamp'
export const THERAPIST = { email: 'bench.therapist@example.org', password: 'bench-therapist-quarry-lamp' }

export interface BenchPerson {
  email: string
  password: string
  personId: string
  linkId: string
}

export interface Seeded {
  therapistId: string
  people: BenchPerson[]
}

const DAY = 24 * 60 * 60 * 1000

/** A moment as the device would send it (DESIGN.md, Data); every bench share carries one of these. */
export function benchMoment(id: string, version: number, i: number): Entry {
  const at = Date.now() - (i % 300) * 60_000
  return {
    id,
    kind: 'moment',
    createdAt: at,
    updatedAt: at + version,
    version,
    body: `Bench moment ${i}, edit ${version}: walked to the station, noticed the tight chest easing after the second stop.`,
    distressBefore: 40 + (i % 30),
    wants: [],
    backgroundThoughts: [],
    tags: ['bench'],
    shares: [],
  }
}

function benchMeasure(id: string, instrument: 'phq9' | 'gad7', i: number, takenAt: number): Entry {
  const n = instrument === 'phq9' ? 9 : 7
  return {
    id,
    kind: 'measure',
    createdAt: takenAt,
    updatedAt: takenAt,
    version: 1,
    body: '',
    wants: [],
    backgroundThoughts: [],
    tags: [],
    shares: [],
    measure: { instrument, answers: Array.from({ length: n }, (_, k) => ((i + k) % 4) as 0 | 1 | 2 | 3), completedAt: takenAt },
  }
}

/**
 * One approved therapist and `count` verified people, each with an active link to them. With `caseload`, each link also
 * gets three shared moments, a past and a coming appointment, and two PHQ-9 and two GAD-7 shared a fortnight apart,
 * so the caseload has its measure columns and change to compute.
 */
export async function seedBench(dataDir: string, count: number, opts: { caseload?: boolean } = {}): Promise<Seeded> {
  const sequelize = await openDatabase(path.join(dataDir, 'rungs.sqlite'))
  try {
    await migrate(sequelize)
    const models = initModels(sequelize)
    const verified = new Date(Date.now() - 60 * DAY)
    // One hash for every bench person: the salt being shared does not matter here, and it saves 200 scrypt runs.
    const personHash = await hashPassword(BENCH_PASSWORD, 1024)
    const admin = await models.User.create({ email: 'bench.admin@example.org', passwordHash: await hashPassword('bench-admin-quarry-lamp', 1024), role: 'admin', displayName: 'Bench Admin', emailVerifiedAt: verified, disabledAt: null })
    const therapist = await models.User.create({ email: THERAPIST.email, passwordHash: await hashPassword(THERAPIST.password, 1024), role: 'therapist', displayName: 'Bench Therapist', emailVerifiedAt: verified, disabledAt: null })
    await models.TherapistProfile.create({
      userId: therapist.id,
      practice: 'Quarry Lane Rooms (invented bench practice)',
      registration: 'Bench register no. QLR-0001',
      approvedAt: verified,
      approvedById: admin.id,
      approvalChecks: JSON.stringify(['registration', 'identity', 'practice']),
      approvalNote: 'Bench data.',
    })
    const users = await models.User.bulkCreate(
      Array.from({ length: count }, (_, i) => ({ email: `bench.person.${i}@example.org`, passwordHash: personHash, role: 'person' as const, displayName: `Bench person ${i}`, emailVerifiedAt: verified, disabledAt: null })),
    )
    const now = Date.now()
    const links = await models.Link.bulkCreate(
      users.map((u, i) => ({ personId: u.id, therapistId: therapist.id, state: 'active' as const, startedAt: new Date(now - (30 + (i % 20)) * DAY), endedAt: null, endedBy: null })),
    )
    if (opts.caseload) {
      await models.Appointment.bulkCreate(links.flatMap((l, i) => [{ linkId: l.id, at: new Date(now - (3 + (i % 5)) * DAY) }, { linkId: l.id, at: new Date(now + (2 + (i % 6)) * DAY) }]))
      const shares = links.flatMap((l, i) => {
        const moments = [0, 1, 2].map((k) => {
          const e = benchMoment(randomUUID(), 1, i * 3 + k)
          return { linkId: l.id, entryId: e.id, kind: e.kind, version: 1, payload: JSON.stringify(e), withdrawnAt: null, readAt: null, toDiscuss: k === 0, riskFlag: false, sharedAt: new Date(now - k * 2 * DAY) }
        })
        const measures = (['phq9', 'gad7'] as const).flatMap((m) =>
          [20, 6].map((daysAgo) => {
            const e = benchMeasure(randomUUID(), m, i + daysAgo, now - daysAgo * DAY)
            // The score columns as putShare stores them.
            return { linkId: l.id, entryId: e.id, kind: e.kind, version: 1, payload: JSON.stringify(e), withdrawnAt: null, readAt: null, toDiscuss: false, riskFlag: false, sharedAt: new Date(now - daysAgo * DAY), ...measureColumnsOf(e) }
          }),
        )
        return [...moments, ...measures]
      })
      await models.SharedEntry.bulkCreate(shares)
    }
    return {
      therapistId: therapist.id,
      people: users.map((u, i) => ({ email: u.email, password: BENCH_PASSWORD, personId: u.id, linkId: links[i]!.id })),
    }
  } finally {
    await sequelize.close()
  }
}
