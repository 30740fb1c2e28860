import type { AccountRow, Approve } from '../../../shared/schemas/admin.schema'
import type { AppDeps } from '../../deps'
import type { User } from '../../db/models/User'
import { HttpError } from '../../middleware/HttpError'

type Deps = Pick<AppDeps, 'models' | 'sequelize'>

function toRow(user: User): AccountRow {
  const p = user.therapistProfile
  return {
    id: user.id,
    email: user.email,
    displayName: user.displayName,
    role: user.role,
    emailVerified: Boolean(user.emailVerifiedAt),
    disabled: Boolean(user.disabledAt),
    createdAt: user.createdAt.toISOString(),
    therapist: p ? { practice: p.practice, registration: p.registration, approvedAt: p.approvedAt?.toISOString() ?? null } : null,
  }
}

/** Every account, for the admin. Holds no clinical content: admins never read it. */
export async function listAccounts(deps: Deps): Promise<AccountRow[]> {
  const users = await deps.models.User.findAll({ include: [{ model: deps.models.TherapistProfile, as: 'therapistProfile' }], order: [['createdAt', 'DESC']] })
  return users.map(toRow)
}

/** Therapists waiting for approval, oldest first. */
export async function listPending(deps: Deps): Promise<AccountRow[]> {
  const users = await deps.models.User.findAll({
    where: { role: 'therapist', disabledAt: null },
    include: [{ model: deps.models.TherapistProfile, as: 'therapistProfile', where: { approvedAt: null }, required: true }],
    order: [['createdAt', 'ASC']],
  })
  return users.map(toRow)
}

/** Disabling signs the account out everywhere at once; its sessions are deleted and deserialisation refuses it. */
export async function setDisabled(deps: Deps, admin: User, userId: string, disabled: boolean): Promise<AccountRow> {
  if (userId === admin.id) throw new HttpError(400, 'self', 'You cannot disable your own account.')
  const user = await deps.models.User.findByPk(userId, { include: [{ model: deps.models.TherapistProfile, as: 'therapistProfile' }] })
  if (!user) throw new HttpError(404, 'not_found', 'There is no such account.')
  await deps.sequelize.transaction(async (transaction) => {
    await user.update({ disabledAt: disabled ? new Date() : null }, { transaction })
    if (disabled) await deps.models.Session.destroy({ where: { userId }, transaction })
    await deps.models.AuditEvent.create({ actorId: admin.id, action: disabled ? 'account.disabled' : 'account.enabled', subjectUserId: userId, subjectId: null }, { transaction })
  })
  return toRow(user)
}

async function therapistProfileOf(deps: Deps, userId: string) {
  const profile = await deps.models.TherapistProfile.findOne({ where: { userId } })
  if (!profile) throw new HttpError(404, 'not_found', 'There is no therapist with that id.')
  return profile
}

/** Records that an admin approved a therapist, what they checked, and when. */
export async function approve(deps: Deps, admin: User, userId: string, input: Approve): Promise<void> {
  const profile = await therapistProfileOf(deps, userId)
  const user = await deps.models.User.findByPk(userId)
  if (!user?.emailVerifiedAt) throw new HttpError(409, 'email_unverified', 'This therapist has not confirmed their e-mail address yet.')
  await profile.update({ approvedAt: new Date(), approvedById: admin.id, approvalChecks: JSON.stringify(input.checks), approvalNote: input.note || null })
  await deps.models.AuditEvent.create({ actorId: admin.id, action: 'therapist.approved', subjectUserId: userId, subjectId: null })
}

export async function revokeApproval(deps: Deps, admin: User, userId: string): Promise<void> {
  const profile = await therapistProfileOf(deps, userId)
  await profile.update({ approvedAt: null, approvedById: null, approvalChecks: null, approvalNote: null })
  await deps.models.AuditEvent.create({ actorId: admin.id, action: 'therapist.approval_revoked', subjectUserId: userId, subjectId: null })
}
