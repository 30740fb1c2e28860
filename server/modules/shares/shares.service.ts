import { Op, UniqueConstraintError, type Transaction } from 'sequelize'
import type { Entry } from '../../../shared/schemas/entry.schema'
import type { AccessLogRow, ShareDeleteResponse, SharePutResponse, ShareStateRow } from '../../../shared/schemas/share.schema'
import type { Link } from '../../db/models/Link'
import type { AppDeps } from '../../deps'
import { HttpError } from '../../middleware/HttpError'
import { clock, linkOfPerson } from '../links/linkAccess'
import { maybeSendShareDigest } from './digest.service'
import { measureColumnsOf } from '../measures/measureColumns'
import { entryRiskFlag } from '../../../shared/content/entryRiskFlag'

type Deps = Pick<AppDeps, 'models' | 'sequelize' | 'mailer' | 'log' | 'config' | 'now'>

const iso = (d: Date | null | undefined) => (d ? d.toISOString() : null)

/**
 * Runs a share write in a transaction that first locks the link's row, so every write to one link's shares waits for the
 * one before it, in this process or another instance (PostgreSQL: SELECT ... FOR UPDATE; SQLite takes the write lock at
 * BEGIN and ignores the row lock). Reading the share after the lock therefore sees every earlier write. Should two
 * inserts of one (linkId, entryId) still meet at the unique index, the loser runs again and finds the winner's row.
 */
async function writeShare<T>(deps: Deps, linkId: string, work: (transaction: Transaction, link: Link) => Promise<T>): Promise<T> {
  for (let attempt = 1; ; attempt++) {
    try {
      return await deps.sequelize.transaction(async (transaction) => {
        const link = await deps.models.Link.findByPk(linkId, { lock: transaction.LOCK.UPDATE, transaction })
        if (!link) throw new HttpError(404, 'not_found', 'There is no such link.')
        return work(transaction, link)
      })
    } catch (err) {
      if (!(err instanceof UniqueConstraintError) || attempt >= 3) throw err
    }
  }
}

/**
 * Stores a share (DESIGN.md, Sharing protocol). A stored copy or tombstone at the same or a higher version makes the call
 * a no-op, so replays and stale retries from the outbox are harmless; a higher version stores, which also re-shares after
 * a withdrawal. The risk flag is computed here, never taken from the device.
 */
export async function putShare(deps: Deps, personId: string, linkId: string, entryId: string, version: number, payload: Entry): Promise<SharePutResponse> {
  const link = await linkOfPerson(deps, personId, linkId)
  if (link.state !== 'active') throw new HttpError(409, 'link_not_active', 'This link has ended, so nothing more can be shared over it.')
  if (payload.id !== entryId) throw new HttpError(400, 'invalid_input', 'payload.id must equal the entry id in the address.')
  const now = clock(deps)
  // The device's list of its own shares names other links; it is nobody else's business, so it is not stored.
  const copy: Entry = { ...payload, shares: [] }
  const values = { kind: payload.kind, version, payload: JSON.stringify(copy), withdrawnAt: null, readAt: null, riskFlag: entryRiskFlag(payload), sharedAt: now, ...measureColumnsOf(payload) }

  const status = await writeShare(deps, linkId, async (transaction, locked) => {
    // Checked again under the lock: an ending that committed since the check above wins.
    if (locked.state !== 'active') throw new HttpError(409, 'link_not_active', 'This link has ended, so nothing more can be shared over it.')
    const row = await deps.models.SharedEntry.findOne({ where: { linkId, entryId }, transaction })
    if (row && row.version >= version) return 'unchanged' as const
    if (row) await row.update(values, { transaction })
    else await deps.models.SharedEntry.create({ linkId, entryId, toDiscuss: false, ...values }, { transaction })
    return 'stored' as const
  })
  if (status === 'stored') await maybeSendShareDigest(deps, link.therapistId)
  const stored = await deps.models.SharedEntry.findOne({ where: { linkId, entryId } })
  return { status, version: stored!.version }
}

/**
 * Withdraws a share: the payload goes, a tombstone stays at the higher of N and the stored version, so the withdrawal can
 * never be undone by an older PUT. Withdrawing what was never shared leaves a tombstone too (the DELETE may overtake its
 * PUT). Idempotent; allowed on an ended link, where it only confirms what ending did.
 */
export async function deleteShare(deps: Deps, personId: string, linkId: string, entryId: string, version: number): Promise<ShareDeleteResponse> {
  await linkOfPerson(deps, personId, linkId)
  const now = clock(deps)
  return writeShare(deps, linkId, async (transaction) => {
    const row = await deps.models.SharedEntry.findOne({ where: { linkId, entryId }, transaction })
    if (!row) {
      await deps.models.SharedEntry.create({ linkId, entryId, kind: null, version, payload: null, withdrawnAt: now, readAt: null, toDiscuss: false, riskFlag: false, sharedAt: null }, { transaction })
      return { status: 'withdrawn' as const, version }
    }
    if (row.withdrawnAt && row.version >= version && row.payload === null) return { status: 'unchanged' as const, version: row.version }
    const at = Math.max(row.version, version)
    await row.update({ version: at, payload: null, withdrawnAt: row.withdrawnAt ?? now, riskFlag: false, toDiscuss: false }, { transaction })
    return { status: 'withdrawn' as const, version: at }
  })
}

/** The person's own shares over one of their links: states only, no payloads. */
export async function listPersonShareStates(deps: Deps, personId: string, linkId: string): Promise<ShareStateRow[]> {
  await linkOfPerson(deps, personId, linkId)
  const rows = await deps.models.SharedEntry.findAll({ where: { linkId }, order: [['updatedAt', 'DESC']] })
  return rows.map((r) => ({ entryId: r.entryId, version: r.version, sharedAt: iso(r.sharedAt), withdrawnAt: iso(r.withdrawnAt), readAt: iso(r.readAt) }))
}

/**
 * When the therapist's screens received which of the person's shared entries: one row per entry per response, repeats
 * within ten minutes coalesced (recordReads), newest first. Holds no content.
 */
export async function accessLog(deps: Deps, personId: string, linkId: string): Promise<AccessLogRow[]> {
  const link = await linkOfPerson(deps, personId, linkId)
  const shares = await deps.models.SharedEntry.findAll({ where: { linkId }, attributes: ['id', 'entryId'] })
  const entryOf = new Map(shares.map((s) => [s.id, s.entryId]))
  if (!entryOf.size) return []
  const [events, therapist] = await Promise.all([
    deps.models.AuditEvent.findAll({ where: { action: 'shares.read', subjectUserId: personId, subjectId: { [Op.in]: [...entryOf.keys()] } }, order: [['at', 'DESC']] }),
    deps.models.User.findByPk(link.therapistId),
  ])
  return events.map((e) => ({ at: e.at.toISOString(), entryId: entryOf.get(e.subjectId!)!, by: therapist?.displayName ?? 'your therapist', action: 'opened' as const }))
}
