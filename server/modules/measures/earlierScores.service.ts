import type { EarlierScoreView } from '../../../shared/schemas/measure.schema'
import type { AppDeps } from '../../deps'
import type { EarlierScore } from '../../db/models/EarlierScore'
import { HttpError } from '../../middleware/HttpError'
import { clock, linkOfPerson, linkOfTherapist } from '../links/linkAccess'
import { parseEarlierScoresCsv } from './earlierScoresCsv'

type Deps = Pick<AppDeps, 'models' | 'sequelize' | 'now'>

export const toEarlierView = (s: EarlierScore): EarlierScoreView => ({
  id: s.id,
  instrument: s.instrument,
  takenOn: s.takenOn,
  total: s.total,
  item9: s.item9,
  enteredBy: s.enteredBy?.displayName ?? 'the therapist',
  enteredAt: s.createdAt.toISOString(),
})

const withEnteredBy = (deps: Deps) => [{ model: deps.models.User, as: 'enteredBy', attributes: ['id', 'displayName'] }]

/** The earlier scores of one link, oldest first (no access check: callers check the link). */
export async function earlierScoresOfLink(deps: Deps, linkId: string): Promise<EarlierScore[]> {
  // Rows of one upload share createdAt; PostgreSQL, unlike SQLite, does not return ties in insertion order, so the order is
  // spelled out to the end: same day, PHQ-9 before GAD-7, then the id.
  return deps.models.EarlierScore.findAll({
    where: { linkId },
    include: withEnteredBy(deps),
    order: [['takenOn', 'ASC'], ['createdAt', 'ASC'], ['instrument', 'DESC'], ['id', 'ASC']],
  })
}

/**
 * Stores a CSV of earlier scores on the therapist's active link. All or nothing: any bad row answers 400 `invalid_csv`
 * with per-row errors and stores no row. The audit row names the link and how many were added, never the scores.
 */
export async function uploadEarlierScores(deps: Deps, therapistId: string, linkId: string, csvText: string): Promise<EarlierScoreView[]> {
  const link = await linkOfTherapist(deps, therapistId, linkId)
  const today = clock(deps).toISOString().slice(0, 10)
  const rows = parseEarlierScoresCsv(csvText, today)
  await deps.sequelize.transaction(async (transaction) => {
    await deps.models.EarlierScore.bulkCreate(
      rows.map((r) => ({ linkId, instrument: r.measure === 'PHQ-9' ? 'phq9' : 'gad7', takenOn: r.date, total: r.total, item9: r.item9 ?? null, enteredById: therapistId })),
      { transaction },
    )
    await deps.models.AuditEvent.create({ actorId: therapistId, action: 'earlierScores.uploaded', subjectUserId: link.personId, subjectId: link.id }, { transaction })
  })
  return (await earlierScoresOfLink(deps, linkId)).map(toEarlierView)
}

/** The earlier scores the therapist entered on their active link, oldest first. */
export async function listEarlierScoresForTherapist(deps: Deps, therapistId: string, linkId: string): Promise<EarlierScoreView[]> {
  await linkOfTherapist(deps, therapistId, linkId)
  return (await earlierScoresOfLink(deps, linkId)).map(toEarlierView)
}

/** Removes one earlier score, to undo a mistake; 404 for an id that is not on this link. */
export async function deleteEarlierScore(deps: Deps, therapistId: string, linkId: string, id: string): Promise<void> {
  const link = await linkOfTherapist(deps, therapistId, linkId)
  const score = await deps.models.EarlierScore.findOne({ where: { id, linkId } })
  if (!score) throw new HttpError(404, 'not_found', 'There is no such earlier score.')
  await deps.sequelize.transaction(async (transaction) => {
    await score.destroy({ transaction })
    await deps.models.AuditEvent.create({ actorId: therapistId, action: 'earlierScores.deleted', subjectUserId: link.personId, subjectId: link.id }, { transaction })
  })
}

/**
 * The earlier scores the therapist entered for the person's own link, so the person sees them too, marked as entered by
 * the therapist. Any state but pending: a pending link has no therapist side yet (and an ended one has none left).
 */
export async function listEarlierScoresForPerson(deps: Deps, personId: string, linkId: string): Promise<EarlierScoreView[]> {
  const link = await linkOfPerson(deps, personId, linkId)
  if (link.state === 'pending') throw new HttpError(404, 'not_found', 'There is no such link.')
  return (await earlierScoresOfLink(deps, linkId)).map(toEarlierView)
}
