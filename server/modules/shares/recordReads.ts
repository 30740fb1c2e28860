import { Op, type Transaction } from 'sequelize'
import type { AppDeps } from '../../deps'
import { clock } from '../links/linkAccess'

type Deps = Pick<AppDeps, 'models' | 'sequelize' | 'now'>

/** How long one "opened" row in the access log covers repeated reads of the same copy by the same person. */
export const READ_WINDOW_MS = 10 * 60_000 // common practice: access logs coalesce repeated views; a screen refreshing is not a new opening

/** A shared copy that a response is about to return: its row id, whose it is, and when its current version arrived. */
export interface ReadCopy {
  id: string
  personId: string
  sharedAt: Date | null
}

// Bound the IN list well under every database's parameter limit.
const CHUNK = 500

/** Per copy id, the latest `shares.read` row by this actor within the window. */
async function recentReads(deps: Deps, actorId: string, ids: string[], since: Date, transaction?: Transaction): Promise<Map<string, Date>> {
  const latest = new Map<string, Date>()
  for (let i = 0; i < ids.length; i += CHUNK) {
    const recent = await deps.models.AuditEvent.findAll({
      where: { actorId, action: 'shares.read', subjectId: { [Op.in]: ids.slice(i, i + CHUNK) }, at: { [Op.gt]: since } },
      attributes: ['subjectId', 'at'],
      transaction,
    })
    for (const e of recent) {
      const seen = latest.get(e.subjectId!)
      if (!seen || e.at > seen) latest.set(e.subjectId!, e.at)
    }
  }
  return latest
}

function unlogged(copies: readonly ReadCopy[], latest: Map<string, Date>): ReadCopy[] {
  const out = new Map<string, ReadCopy>()
  for (const c of copies) {
    const seen = latest.get(c.id)
    if (seen && (!c.sharedAt || seen >= c.sharedAt)) continue
    out.set(c.id, c)
  }
  return [...out.values()]
}

/**
 * Writes the person's access-log rows (`shares.read`) for copies a response returns to `actorId` (DESIGN.md, Access log):
 * one row per copy, unless this actor already has a row for it within READ_WINDOW_MS that is no older than the copy's
 * current version. So a refresh writes nothing new, while a new version, or a read after the window, is a new opening.
 * One indexed SELECT (audit_events_actor_reads) per 500 copies, then one insert of the missing rows.
 * @returns how many rows were written
 */
export async function recordReads(deps: Deps, actorId: string, copies: readonly ReadCopy[], transaction?: Transaction): Promise<number> {
  if (!copies.length) return 0
  const at = clock(deps)
  const since = new Date(at.getTime() - READ_WINDOW_MS)
  const ids = [...new Set(copies.map((c) => c.id))]
  const write = async (t: Transaction) => {
    // PostgreSQL runs transactions side by side (and across instances): one reader's check-then-insert goes one at a time.
    if (deps.sequelize.getDialect() === 'postgres')
      await deps.sequelize.query('SELECT pg_advisory_xact_lock(hashtext(:key))', { replacements: { key: `reads:${actorId}` }, transaction: t })
    const missing = unlogged(copies, await recentReads(deps, actorId, ids, since, t))
    if (missing.length) await deps.models.AuditEvent.bulkCreate(missing.map((c) => ({ actorId, action: 'shares.read', subjectUserId: c.personId, subjectId: c.id, at })), { transaction: t })
    return missing.length
  }
  if (transaction) return write(transaction)
  // Outside a transaction: a refresh within the window finds every row and writes nothing, without taking the write lock.
  // Otherwise look again inside one, since managed transactions run one at a time: a burst of identical requests then
  // writes one row per copy, not one per request; on PostgreSQL the advisory lock above does the same across instances.
  if (!unlogged(copies, await recentReads(deps, actorId, ids, since)).length) return 0
  return deps.sequelize.transaction(write)
}
