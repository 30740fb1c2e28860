import type { TherapistProfilePatch } from '../../../shared/schemas/therapist.schema'
import type { AppDeps } from '../../deps'
import { HttpError } from '../../middleware/HttpError'

/**
 * Edits the practice or registration. A change to either clears the approval: the admin checked the old text,
 * so people must not see an "approved" badge on details nobody checked.
 */
export async function updateProfile(deps: Pick<AppDeps, 'models'>, userId: string, patch: TherapistProfilePatch) {
  const profile = await deps.models.TherapistProfile.findOne({ where: { userId } })
  if (!profile) throw new HttpError(404, 'not_found', 'There is no therapist profile for this account.')
  const changed = (patch.practice !== undefined && patch.practice !== profile.practice) || (patch.registration !== undefined && patch.registration !== profile.registration)
  await profile.update({
    ...patch,
    ...(changed ? { approvedAt: null, approvedById: null, approvalChecks: null, approvalNote: null } : {}),
  })
  if (changed) await deps.models.AuditEvent.create({ actorId: userId, action: 'therapist.profile_changed', subjectUserId: userId, subjectId: null })
  return profile
}
