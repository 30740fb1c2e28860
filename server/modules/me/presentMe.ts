import type { Me } from '../../../shared/schemas/user.schema'
import type { Models } from '../../db/associations'
import type { User } from '../../db/models/User'
import type { TherapistProfile } from '../../db/models/TherapistProfile'

/** The approval as shown to anyone: what the admin checked, when, and who. */
export async function presentApproval(models: Models, profile: TherapistProfile) {
  if (!profile.approvedAt) return null
  const approver = profile.approvedById ? await models.User.findByPk(profile.approvedById) : null
  return {
    approvedAt: profile.approvedAt.toISOString(),
    approvedByName: approver?.displayName ?? 'a Rungs admin',
    checks: profile.approvalChecks ? (JSON.parse(profile.approvalChecks) as string[]) : [],
    note: profile.approvalNote,
  }
}

export async function presentMe(models: Models, user: User): Promise<Me> {
  const profile = user.therapistProfile ?? (user.role === 'therapist' ? await models.TherapistProfile.findOne({ where: { userId: user.id } }) : null)
  return {
    id: user.id,
    email: user.email,
    displayName: user.displayName,
    role: user.role,
    emailVerified: Boolean(user.emailVerifiedAt),
    emailNotices: user.emailNotices,
    therapist: profile ? { practice: profile.practice, registration: profile.registration, approval: await presentApproval(models, profile) } : null,
  }
}
