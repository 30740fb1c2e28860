import { hashPassword } from '../auth/password'
import type { Models } from './associations'

/**
 * The invented demo scenario: Fernhill Talking Rooms, a practice that does not exist, and people who do not exist.
 * For local use only; the README lists these sign-ins.
 */
export const demoAccounts = {
  admin: { email: 'admin@fernhill.example', password: 'demo-admin-ledger', displayName: 'Noor Castellan' },
  therapist: { email: 'amara.quint@fernhill.example', password: 'demo-therapist-kettle', displayName: 'Amara Quint' },
  pendingTherapist: { email: 'lewis.hartigan@fernhill.example', password: 'demo-therapist-lantern', displayName: 'Lewis Hartigan' },
  person: { email: 'robin.ashdown@example.org', password: 'demo-person-orchard', displayName: 'Robin' },
} as const

/** Seeds the demo accounts when the database has no users at all; returns whether it did. */
export async function seedDemoIfEmpty(models: Models, scryptCost: number): Promise<boolean> {
  if ((await models.User.count()) > 0) return false
  const verified = new Date('2026-09-01T09:00:00Z')
  const make = async (a: { email: string; password: string; displayName: string }, role: 'admin' | 'therapist' | 'person') =>
    models.User.create({ email: a.email, passwordHash: await hashPassword(a.password, scryptCost), role, displayName: a.displayName, emailVerifiedAt: verified, disabledAt: null })

  const admin = await make(demoAccounts.admin, 'admin')
  const therapist = await make(demoAccounts.therapist, 'therapist')
  await models.TherapistProfile.create({
    userId: therapist.id,
    practice: 'Fernhill Talking Rooms (invented demo practice)',
    registration: 'Counselling psychologist, demo register no. FTR-20417',
    approvedAt: new Date('2026-09-02T14:30:00Z'),
    approvedById: admin.id,
    approvalChecks: JSON.stringify(['registration', 'identity', 'practice']),
    approvalNote: 'Checked against the demo register entry; this whole scenario is invented.',
  })
  const pending = await make(demoAccounts.pendingTherapist, 'therapist')
  await models.TherapistProfile.create({
    userId: pending.id,
    practice: 'Fernhill Talking Rooms (invented demo practice)',
    registration: 'Psychotherapist, demo register no. FTR-31882',
    approvedAt: null,
    approvedById: null,
    approvalChecks: null,
    approvalNote: null,
  })
  const person = await make(demoAccounts.person, 'person')
  // An active link between Robin and Amara, with one past and one coming session, relative to now so it never goes stale.
  const day = 24 * 60 * 60 * 1000
  const now = Date.now()
  const link = await models.Link.create({ personId: person.id, therapistId: therapist.id, state: 'active', startedAt: new Date(now - 21 * day), endedAt: null, endedBy: null })
  await models.Appointment.bulkCreate([
    { linkId: link.id, at: new Date(now - 7 * day) },
    { linkId: link.id, at: new Date(now + 7 * day) },
  ])
  // Two invented intake scores from before the link, entered by Amara, so change is counted from Robin's true first score.
  const intake = new Date(now - 35 * day).toISOString().slice(0, 10)
  await models.EarlierScore.bulkCreate([
    { linkId: link.id, instrument: 'phq9', takenOn: intake, total: 14, item9: 0, enteredById: therapist.id },
    { linkId: link.id, instrument: 'gad7', takenOn: intake, total: 11, item9: null, enteredById: therapist.id },
  ])
  return true
}
