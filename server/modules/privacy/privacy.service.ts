import { randomUUID } from 'node:crypto'
import { Op } from 'sequelize'
import { ACCOUNT_EXPORT_FORMAT, ACCOUNT_EXPORT_VERSION, staffCloseMessage } from '../../../shared/schemas/privacy.schema'
import { verifyPassword } from '../../auth/password'
import type { AppDeps } from '../../deps'
import type { User } from '../../db/models/User'
import { accountClosedMail } from '../../mail/templates/privacyMail'
import { HttpError } from '../../middleware/HttpError'
import { clock } from '../links/linkAccess'

type Deps = Pick<AppDeps, 'models' | 'sequelize' | 'mailer' | 'log' | 'now'>

const iso = (d: Date | null | undefined) => (d ? d.toISOString() : null)

export const exportReadme =
  'Everything the Rungs server holds about your account, as JSON (GDPR Art. 20). Your journal itself lives on your ' +
  'device and is not here; make a backup in Rungs to keep a copy of it. Left out on purpose: your password (only a ' +
  'one-way hash is kept, and it is not shared), sign-in sessions and e-mailed links, invitation codes, and the prep ' +
  'notes a therapist writes: those are the therapist\'s own working notes, not something you shared. "by" in the ' +
  'events says who acted: you, your therapist, an admin, or Rungs itself.'

function safeJson(text: string | null): unknown {
  if (text === null) return null
  try {
    return JSON.parse(text)
  } catch {
    return null
  }
}

/**
 * Everything the server holds about one account, in one structured document: the account and its preferences, links
 * (with the therapist's name and practice), appointments, every shared copy (payloads and tombstones), the earlier
 * scores entered for them, and the audit events about them as actions and dates. Password hashes, sessions, tokens,
 * invitation code hashes and the therapist's prep notes are never read here. Writes the `account.exported` access-log
 * row before anything leaves.
 */
export async function exportAccount(deps: Deps, user: User) {
  const { models } = deps
  const now = clock(deps)
  await models.AuditEvent.create({ actorId: user.id, action: 'account.exported', subjectUserId: user.id, subjectId: null, at: now })

  const links = await models.Link.findAll({
    where: { personId: user.id },
    include: [{ model: models.User, as: 'therapist', attributes: ['id', 'displayName'], include: [{ model: models.TherapistProfile, as: 'therapistProfile', attributes: ['practice'] }] }],
    order: [['createdAt', 'ASC']],
  })
  const linkIds = links.map((l) => l.id)
  const inLinks = { linkId: { [Op.in]: linkIds } }
  const [appointments, shares, scores, events] = await Promise.all([
    models.Appointment.findAll({ where: inLinks, order: [['at', 'ASC']] }),
    models.SharedEntry.findAll({ where: inLinks, order: [['sharedAt', 'ASC']] }),
    models.EarlierScore.findAll({ where: inLinks, order: [['takenOn', 'ASC']] }),
    models.AuditEvent.findAll({ where: { [Op.or]: [{ subjectUserId: user.id }, { actorId: user.id }] }, order: [['at', 'ASC']] }),
  ])

  // Other people appear in events only as a role word, never by id or name.
  const actorIds = [...new Set(events.map((e) => e.actorId).filter((id): id is string => Boolean(id) && id !== user.id))]
  const actors = actorIds.length ? await models.User.findAll({ where: { id: { [Op.in]: actorIds } }, attributes: ['id', 'role'] }) : []
  const roleOf = new Map(actors.map((a) => [a.id, a.role]))
  const by = (actorId: string | null) =>
    !actorId ? 'Rungs' : actorId === user.id ? 'you' : roleOf.get(actorId) === 'therapist' ? 'your therapist' : roleOf.get(actorId) === 'admin' ? 'an admin' : 'someone else'
  const entryOfShare = new Map(shares.map((s) => [s.id, s.entryId]))
  const linkSet = new Set(linkIds)

  return {
    format: ACCOUNT_EXPORT_FORMAT,
    formatVersion: ACCOUNT_EXPORT_VERSION,
    exportedAt: now.toISOString(),
    readme: exportReadme,
    account: {
      id: user.id,
      email: user.email,
      displayName: user.displayName,
      role: user.role,
      createdAt: iso(user.createdAt),
      emailVerifiedAt: iso(user.emailVerifiedAt),
      preferences: { displayName: user.displayName, emailNotices: user.emailNotices },
    },
    links: links.map((l) => ({
      id: l.id,
      state: l.state,
      createdAt: iso(l.createdAt),
      startedAt: iso(l.startedAt),
      endedAt: iso(l.endedAt),
      endedBy: !l.endedBy ? null : l.endedBy === user.id ? 'you' : 'your therapist',
      therapist: { displayName: l.therapist?.displayName ?? null, practice: l.therapist?.therapistProfile?.practice ?? null },
    })),
    appointments: appointments.map((a) => ({ linkId: a.linkId, at: iso(a.at), createdAt: iso(a.createdAt) })),
    sharedCopies: shares.map((s) => ({
      linkId: s.linkId,
      entryId: s.entryId,
      kind: s.kind,
      version: s.version,
      payload: safeJson(s.payload),
      sharedAt: iso(s.sharedAt),
      updatedAt: iso(s.updatedAt),
      withdrawnAt: iso(s.withdrawnAt),
      readAt: iso(s.readAt),
      toDiscuss: s.toDiscuss,
      riskFlag: s.riskFlag,
    })),
    earlierScores: scores.map((s) => ({ linkId: s.linkId, instrument: s.instrument, takenOn: s.takenOn, total: s.total, item9: s.item9, enteredAt: iso(s.createdAt) })),
    auditEvents: events.map((e) => ({
      action: e.action,
      at: iso(e.at),
      by: by(e.actorId),
      ...(e.subjectId && linkSet.has(e.subjectId) ? { linkId: e.subjectId } : {}),
      ...(e.subjectId && entryOfShare.has(e.subjectId) ? { entryId: entryOfShare.get(e.subjectId) } : {}),
    })),
  }
}

export type AccountExport = Awaited<ReturnType<typeof exportAccount>>

/**
 * Closes a person's account (GDPR Art. 17) once the password is confirmed again. In one transaction: every shared copy
 * over their links (payloads and tombstones), every earlier score and appointment of those links, their e-mail tokens and
 * sessions go; their links end (ended by them); their address is taken off any invitation; and the user row is
 * anonymised. Afterwards each therapist of an active link gets a notice without content.
 *
 * Why anonymise instead of deleting the row: links point at the user, and a therapist's prep notes point at the link.
 * The notes are the therapist's own working notes and outlive a link (DESIGN.md), so the link rows stay as ended links
 * and the user row stays as a tombstone: the same id, no e-mail, no name, no password, disabled. Audit rows keep only
 * actions, dates and that tombstone id; they never held content.
 */
export async function closeAccount(deps: Deps, user: User, password: string): Promise<void> {
  const { models } = deps
  if (user.role !== 'person') {
    throw new HttpError(403, 'forbidden', user.role === 'admin' ? 'Ask another admin to close an admin account.' : staffCloseMessage)
  }
  // One answer for any wrong password; nothing is touched.
  if (!(await verifyPassword(password, user.passwordHash))) throw new HttpError(403, 'wrong_password', 'That password is not right. Nothing was changed.')

  const now = clock(deps)
  const notify = await deps.sequelize.transaction(async (transaction) => {
    // Locked first, so a share being written to one of these links through another instance finishes before, or finds
    // the link ended after (see shares.service.ts).
    const links = await models.Link.findAll({ where: { personId: user.id }, lock: transaction.LOCK.UPDATE, transaction })
    const linkIds = links.map((l) => l.id)
    const inLinks = { linkId: { [Op.in]: linkIds } }
    await models.SharedEntry.destroy({ where: inLinks, transaction })
    await models.EarlierScore.destroy({ where: inLinks, transaction })
    await models.Appointment.destroy({ where: inLinks, transaction })
    const active = links.filter((l) => l.state === 'active').map((l) => l.therapistId)
    await models.Link.update({ state: 'ended', endedAt: now, endedBy: user.id }, { where: { personId: user.id, state: { [Op.ne]: 'ended' } }, transaction })
    await models.EmailToken.destroy({ where: { userId: user.id }, transaction })
    await models.Session.destroy({ where: { userId: user.id }, transaction })
    await models.Invitation.update({ email: null }, { where: { email: user.email }, transaction })
    const therapists = active.length ? await models.User.findAll({ where: { id: { [Op.in]: [...new Set(active)] } }, transaction }) : []
    const name = user.displayName
    await user.update(
      {
        email: `closed-${user.id}@closed.invalid`,
        displayName: 'Closed account',
        // Not a scrypt string, so no password can ever match it.
        passwordHash: `closed$${randomUUID()}`,
        emailVerifiedAt: null,
        emailNotices: false,
        disabledAt: now,
      },
      { transaction },
    )
    await models.AuditEvent.create({ actorId: user.id, action: 'account.closed', subjectUserId: user.id, subjectId: null, at: now }, { transaction })
    return therapists.map((t) => accountClosedMail(t.email, t.displayName, name))
  })

  for (const mail of notify) {
    try {
      await deps.mailer.send(mail)
    } catch (err) {
      deps.log.warn({ err }, 'mail: an account-closed notice could not be sent')
    }
  }
}
