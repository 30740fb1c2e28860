import { Op } from 'sequelize'
import type { AppDeps } from '../../deps'
import { sharedDigestMail } from '../../mail/templates/linkMail'
import { clock, sendNotice } from '../links/linkAccess'

type Deps = Pick<AppDeps, 'models' | 'sequelize' | 'mailer' | 'log' | 'config' | 'now'>

/** At most one "new shared entries" notice per therapist per this period. */
export const DIGEST_PERIOD_MS = 60 * 60 * 1000

/**
 * Called after a share is stored. Sends the therapist a notice with counts only (never entry text, never a name in the
 * subject) unless one went out within DIGEST_PERIOD_MS; the next notice after a quiet period counts everything stored
 * since the last one. The sending is recorded as an audit row, so the period survives a restart.
 *
 * Several app instances (or two shares at once) may call this together: the audit row is written first, in a
 * transaction that locks the therapist's user row, so only one caller claims the period. The mail goes after the commit;
 * if it cannot be sent, the claim is removed and the next share tries again.
 */
export async function maybeSendShareDigest(deps: Deps, therapistId: string): Promise<boolean> {
  const now = clock(deps)
  const claim = await deps.sequelize.transaction(async (transaction) => {
    const therapist = await deps.models.User.findByPk(therapistId, { lock: transaction.LOCK.UPDATE, transaction })
    if (!therapist || !therapist.emailNotices) return null
    const last = await deps.models.AuditEvent.findOne({ where: { action: 'digest.sent', subjectUserId: therapistId }, order: [['at', 'DESC']], transaction })
    if (last && now.getTime() - last.at.getTime() < DIGEST_PERIOD_MS) return null

    const links = await deps.models.Link.findAll({ where: { therapistId, state: 'active' }, attributes: ['id'], transaction })
    const fresh = await deps.models.SharedEntry.findAll({
      where: { linkId: links.map((l) => l.id), withdrawnAt: null, ...(last ? { sharedAt: { [Op.gt]: last.at } } : {}) },
      attributes: ['linkId'],
      transaction,
    })
    if (!fresh.length) return null
    const row = await deps.models.AuditEvent.create({ actorId: null, action: 'digest.sent', subjectUserId: therapistId, subjectId: null, at: now }, { transaction })
    return { therapist, row, entries: fresh.length, people: new Set(fresh.map((s) => s.linkId)).size }
  })
  if (!claim) return false
  const { therapist, row, entries, people } = claim
  const sent = await sendNotice(deps, therapist, sharedDigestMail(therapist.email, therapist.displayName, entries, people, deps.config.appUrl))
  if (!sent) await row.destroy()
  return sent
}
