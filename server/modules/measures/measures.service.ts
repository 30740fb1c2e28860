import { Op, type Transaction } from 'sequelize'
import type { InstrumentId } from '../../../shared/content/measureForms'
import { entrySchema } from '../../../shared/schemas/entry.schema'
import type { MeasureResult, MeasureSummary } from '../../../shared/schemas/measure.schema'
import type { LinkMeasures } from '../../../shared/schemas/measureReport.schema'
import { firstLastPair, measureResultOfEarlierScore, measureResultOfEntry, scoredSeries, summariseMeasure } from '../../../shared/scoring/measureResults'
import { classifyCourse, measureChange } from '../../../shared/scoring/talkingTherapies'
import type { AppDeps } from '../../deps'
import type { EarlierScore } from '../../db/models/EarlierScore'
import type { Link } from '../../db/models/Link'
import { clock, linkOfTherapist } from '../links/linkAccess'
import { toEarlierView } from './earlierScores.service'

type Deps = Pick<AppDeps, 'models' | 'sequelize' | 'now'>

const liveMeasures = (linkIds: string[]) => ({ linkId: { [Op.in]: linkIds }, kind: 'measure', withdrawnAt: null, payload: { [Op.ne]: null } })

/** A shared copy scored from its raw answers; a stored total is never trusted, and a copy that does not parse is left out. */
function scoreShared(row: { id: string; payload: string | null }): MeasureResult | null {
  const parsed = entrySchema.safeParse(JSON.parse(row.payload ?? 'null'))
  return parsed.success ? measureResultOfEntry(parsed.data) : null
}

const byTakenAt = (a: MeasureResult, b: MeasureResult) => a.takenAt.localeCompare(b.takenAt) || a.source.localeCompare(b.source)

export interface LoadedMeasures {
  link: Link
  results: MeasureResult[]
  /** Item 9 as given, by result id (earlier scores keep only a total and an optional item 9). */
  item9: Map<string, number | null>
}

/**
 * The scored results of one active link: shared questionnaires plus earlier scores, oldest first. Returning shared
 * content is what "opened" means in the person's access log, so one `shares.read` row per shared questionnaire returned
 * is written in the same transaction.
 */
export async function loadLinkMeasures(deps: Deps, therapistId: string, linkId: string): Promise<LoadedMeasures> {
  const link = await linkOfTherapist(deps, therapistId, linkId)
  return deps.sequelize.transaction(async (transaction: Transaction) => {
    const rows = await deps.models.SharedEntry.findAll({ where: liveMeasures([linkId]), attributes: ['id', 'payload'], transaction })
    const earlier = await deps.models.EarlierScore.findAll({ where: { linkId }, include: [{ model: deps.models.User, as: 'enteredBy', attributes: ['id', 'displayName'] }], transaction })
    const item9 = new Map<string, number | null>()
    const shared: MeasureResult[] = []
    const opened: string[] = []
    for (const row of rows) {
      const r = scoreShared(row)
      if (!r) continue
      shared.push(r)
      opened.push(row.id)
      item9.set(r.id, r.instrument === 'phq9' ? (r.answers?.[8] ?? null) : null)
    }
    for (const e of earlier) item9.set(e.id, e.item9)
    if (opened.length) {
      const at = clock(deps)
      await deps.models.AuditEvent.bulkCreate(opened.map((subjectId) => ({ actorId: therapistId, action: 'shares.read', subjectUserId: link.personId, subjectId, at })), { transaction })
    }
    const results = [...shared, ...earlier.map((e) => measureResultOfEarlierScore(toEarlierView(e)))].sort(byTakenAt)
    return { link, results, item9 }
  })
}

/** Results, the NHS Talking Therapies course outcome (null until a measure has two scores) and the change per measure. */
export function reportOf(results: MeasureResult[]): LinkMeasures {
  const pair = firstLastPair(results)
  const changes: LinkMeasures['changes'] = {}
  for (const m of ['phq9', 'gad7'] as const) if (pair[m]) changes[m] = measureChange(m, pair[m])
  return { results, outcome: classifyCourse(pair), changes }
}

/** GET /api/therapist/links/:linkId/measures. */
export async function linkMeasures(deps: Deps, therapistId: string, linkId: string): Promise<LinkMeasures> {
  return reportOf((await loadLinkMeasures(deps, therapistId, linkId)).results)
}

export type CaseloadMeasures = { phq9: MeasureSummary | null; gad7: MeasureSummary | null }

/**
 * The caseload's measure column for many links at once: two queries in all, not two per person. The shared copies behind
 * each summary's latest and first score are content shown in summary form, so each gets a `shares.read` access-log row.
 */
export async function caseloadMeasures(deps: Deps, therapistId: string, links: Link[]): Promise<Map<string, CaseloadMeasures>> {
  const out = new Map<string, CaseloadMeasures>()
  if (!links.length) return out
  const ids = links.map((l) => l.id)
  const [rows, earlier] = await Promise.all([
    deps.models.SharedEntry.findAll({ where: liveMeasures(ids), attributes: ['id', 'linkId', 'payload'] }),
    deps.models.EarlierScore.findAll({ where: { linkId: { [Op.in]: ids } } }),
  ])
  const byLink = new Map<string, MeasureResult[]>(ids.map((id) => [id, []]))
  const rowOf = new Map<string, string>()
  for (const row of rows) {
    const r = scoreShared(row)
    if (!r) continue
    byLink.get(row.linkId)!.push(r)
    rowOf.set(`${row.linkId}:${r.id}`, row.id)
  }
  for (const e of earlier as EarlierScore[]) byLink.get(e.linkId)!.push(measureResultOfEarlierScore(toEarlierView(e)))
  const opened: { subjectId: string; personId: string }[] = []
  for (const link of links) {
    const results = byLink.get(link.id)!
    const summary = (m: InstrumentId) => summariseMeasure(results, m)
    out.set(link.id, { phq9: summary('phq9'), gad7: summary('gad7') })
    for (const m of ['phq9', 'gad7'] as const) {
      const series = scoredSeries(results, m)
      for (const r of new Set([series[0], series[series.length - 1]])) {
        const rowId = r && rowOf.get(`${link.id}:${r.id}`)
        if (rowId) opened.push({ subjectId: rowId, personId: link.personId })
      }
    }
  }
  if (opened.length) {
    const at = clock(deps)
    await deps.models.AuditEvent.bulkCreate(opened.map((o) => ({ actorId: therapistId, action: 'shares.read', subjectUserId: o.personId, subjectId: o.subjectId, at })))
  }
  return out
}
