import { Op } from 'sequelize'
import type { AppDeps } from '../../deps'
import { sharedDigestMail } from '../../mail/templates/linkMail'
import { clock, sendNotice } from '../links/linkAccess'

type Deps = Pick<AppDeps, 'models' | 'mailer' | 'log' | 'config' | 'now'>

/** At most one "new shared entries" notice per therapist per this period. */
export const DIGEST_PERIOD_MS = 60 * 60 * 1000

/**
 * Called after a share is stored. Sends the therapist a notice with counts only (never entry text, never a name in the
 * subject) unless one went out within DIGEST_PERIOD_MS; the next notice after a quiet period counts everything stored
 * since the last one. The sending is recorded as an audit row, so the period survives a restart.
 */
export async function maybeSendShareDigest(deps: Deps, therapistId: string): Promise<boolean> {
  const now = clock(deps)
  const therapist = await deps.models.User.findByPk(therapistId)
  if (!therapist || !therapist.emailNotices) return false
  const last = await deps.models.AuditEvent.findOne({ where: { action: 'digest.sent', subjectUserId: therapistId }, order: [['at', 'DESC']] })
  if (last && now.getTime() - last.at.getTime() < DIGEST_PERIOD_MS) return false

  const links = await deps.models.Link.findAll({ where: { therapistId, state: 'active' }, attributes: ['id'] })
  const fresh = await deps.models.SharedEntry.findAll({
    where: { linkId: links.map((l) => l.id), withdrawnAt: null, ...(last ? { sharedAt: { [Op.gt]: last.at } } : {}) },
    attributes: ['linkId'],
  })
  if (!fresh.length) return false
  const people = new Set(fresh.map((s) => s.linkId)).size
  const sent = await sendNotice(deps, therapist, sharedDigestMail(therapist.email, therapist.displayName, fresh.length, people, deps.config.appUrl))
  if (sent) await deps.models.AuditEvent.create({ actorId: null, action: 'digest.sent', subjectUserId: therapistId, subjectId: null, at: now })
  return sent
}
