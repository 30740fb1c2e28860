import { Op, type Transaction } from 'sequelize'
import type { InstrumentId } from '../../../shared/content/measureForms'
import type { Entry } from '../../../shared/schemas/entry.schema'
import type { MeasureResult, MeasureSummary } from '../../../shared/schemas/measure.schema'
import type { LinkMeasures } from '../../../shared/schemas/measureReport.schema'
import { firstLastPair, measureResultOfEarlierScore, measureResultOfEntry, scoredSeries, summariseMeasure } from '../../../shared/scoring/measureResults'
import { classifyCourse, measureChange } from '../../../shared/scoring/talkingTherapies'
import type { AppDeps } from '../../deps'
import type { EarlierScore } from '../../db/models/EarlierScore'
import type { Link } from '../../db/models/Link'
import { linkOfTherapist } from '../links/linkAccess'
import { recordReads } from '../shares/recordReads'
import { toEarlierView } from './earlierScores.service'

type Deps = Pick<AppDeps, 'models' | 'sequelize' | 'now'>

const liveMeasures = (linkIds: string[]) => ({ linkId: { [Op.in]: linkIds }, kind: 'measure', withdrawnAt: null, payload: { [Op.ne]: null } })

/**
 * A shared copy scored from its raw answers; a total in the payload is never trusted. Payloads were validated with
 * entrySchema when stored (putShare), so they are only parsed here; one that does not parse is left out.
 */
function scoreShared(row: { payload: string | null }): MeasureResult | null {
  try {
    return row.payload === null ? null : measureResultOfEntry(JSON.parse(row.payload) as Entry)
  } catch {
    return null
  }
}

/** What the caseload needs of one shared copy: the server's stored score when it has one, else scored from the payload. */
function caseloadResultOf(row: { entryId: string; payload: string | null; measureInstrument: string | null; measureTotal: number | null; measureTakenAt: Date | null }): MeasureResult | null {
  if (row.measureInstrument === null || row.measureTakenAt === null) return scoreShared(row)
  // Only id, instrument, takenAt, total and source are read by summariseMeasure and scoredSeries.
  return { id: row.entryId, instrument: row.measureInstrument as InstrumentId, takenAt: row.measureTakenAt.toISOString(), total: row.measureTotal, band: null, prorated: false, selfHarm: null, source: 'person' }
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
 * content is what "opened" means in the person's access log, so each shared questionnaire returned gets a `shares.read`
 * row in the same transaction (at most one per copy and version per READ_WINDOW_MS, see recordReads).
 */
export async function loadLinkMeasures(deps: Deps, therapistId: string, linkId: string): Promise<LoadedMeasures> {
  const link = await linkOfTherapist(deps, therapistId, linkId)
  return deps.sequelize.transaction(async (transaction: Transaction) => {
    const rows = await deps.models.SharedEntry.findAll({ where: liveMeasures([linkId]), attributes: ['id', 'payload', 'sharedAt'], transaction })
    const earlier = await deps.models.EarlierScore.findAll({ where: { linkId }, include: [{ model: deps.models.User, as: 'enteredBy', attributes: ['id', 'displayName'] }], transaction })
    const item9 = new Map<string, number | null>()
    const shared: MeasureResult[] = []
    const opened: { id: string; personId: string; sharedAt: Date | null }[] = []
    for (const row of rows) {
      const r = scoreShared(row)
      if (!r) continue
      shared.push(r)
      opened.push({ id: row.id, personId: link.personId, sharedAt: row.sharedAt })
      item9.set(r.id, r.instrument === 'phq9' ? (r.answers?.[8] ?? null) : null)
    }
    for (const e of earlier) item9.set(e.id, e.item9)
    await recordReads(deps, therapistId, opened, transaction)
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
 * each summary's latest and first score are content shown in summary form, so each gets a `shares.read` access-log row
 * (at most one per copy and version per READ_WINDOW_MS, see recordReads).
 */
export async function caseloadMeasures(deps: Deps, therapistId: string, links: Link[]): Promise<Map<string, CaseloadMeasures>> {
  const out = new Map<string, CaseloadMeasures>()
  if (!links.length) return out
  const ids = links.map((l) => l.id)
  const [scored, unscored, earlier] = await Promise.all([
    // The payload only for copies stored before the score columns existed.
    deps.models.SharedEntry.findAll({ where: { ...liveMeasures(ids), measureTakenAt: { [Op.ne]: null } }, attributes: ['id', 'linkId', 'entryId', 'sharedAt', 'measureInstrument', 'measureTotal', 'measureTakenAt'], raw: true }),
    deps.models.SharedEntry.findAll({ where: { ...liveMeasures(ids), measureTakenAt: null }, attributes: ['id', 'linkId', 'entryId', 'sharedAt', 'payload', 'measureInstrument', 'measureTotal', 'measureTakenAt'] }),
    deps.models.EarlierScore.findAll({ where: { linkId: { [Op.in]: ids } } }),
  ])
  const byLink = new Map<string, MeasureResult[]>(ids.map((id) => [id, []]))
  const rowOf = new Map<string, { id: string; sharedAt: Date | null }>()
  for (const row of [...scored, ...unscored]) {
    const r = caseloadResultOf({ ...row, measureTakenAt: row.measureTakenAt === null ? null : new Date(row.measureTakenAt), payload: row.payload ?? null })
    if (!r) continue
    byLink.get(row.linkId)!.push(r)
    rowOf.set(`${row.linkId}:${r.id}`, { id: row.id, sharedAt: row.sharedAt === null ? null : new Date(row.sharedAt) })
  }
  for (const e of earlier as EarlierScore[]) byLink.get(e.linkId)!.push(measureResultOfEarlierScore(toEarlierView(e)))
  const opened: { id: string; personId: string; sharedAt: Date | null }[] = []
  for (const link of links) {
    const results = byLink.get(link.id)!
    const summary = (m: InstrumentId) => summariseMeasure(results, m)
    out.set(link.id, { phq9: summary('phq9'), gad7: summary('gad7') })
    for (const m of ['phq9', 'gad7'] as const) {
      const series = scoredSeries(results, m)
      for (const r of new Set([series[0], series[series.length - 1]])) {
        const row = r && rowOf.get(`${link.id}:${r.id}`)
        if (row) opened.push({ ...row, personId: link.personId })
      }
    }
  }
  await recordReads(deps, therapistId, opened)
  return out
}
