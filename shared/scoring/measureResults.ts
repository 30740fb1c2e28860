import type { InstrumentId } from '../content/measureForms'
import type { Entry } from '../schemas/entry.schema'
import type { EarlierScoreView, MeasureResult, MeasureSummary } from '../schemas/measure.schema'
import { bandOf, scoreMeasure } from './scoreMeasure'
import type { MeasurePair } from './talkingTherapies'

/** A completed questionnaire entry as a result; null for other kinds and for forms still in progress. */
export function measureResultOfEntry(entry: Entry): MeasureResult | null {
  const m = entry.measure
  if (entry.kind !== 'measure' || !m || m.completedAt === undefined) return null
  const score = scoreMeasure(m.instrument, m.answers)
  return {
    id: entry.id,
    instrument: m.instrument,
    takenAt: new Date(entry.createdAt).toISOString(),
    total: score.status === 'scored' ? score.total : null,
    band: score.status === 'scored' ? score.band : null,
    prorated: score.status === 'scored' && score.prorated,
    selfHarm: score.selfHarm,
    source: 'person',
    answers: [...m.answers],
    ...(m.difficulty !== undefined ? { difficulty: m.difficulty } : {}),
  }
}

/** An earlier score entered by the therapist; its item 9 is unknown unless they gave it. */
export function measureResultOfEarlierScore(s: EarlierScoreView): MeasureResult {
  const selfHarm = s.instrument !== 'phq9' ? null : s.item9 === null ? 'unknown' : s.item9 > 0 ? 'flag' : 'none'
  return { id: s.id, instrument: s.instrument, takenAt: `${s.takenOn}T12:00:00.000Z`, total: s.total, band: bandOf(s.instrument, s.total), prorated: false, selfHarm, source: 'therapist' }
}

/** Results of one measure with a total, oldest first. */
export function scoredSeries(results: readonly MeasureResult[], instrument: InstrumentId): (MeasureResult & { total: number })[] {
  return results
    .filter((r): r is MeasureResult & { total: number } => r.instrument === instrument && r.total !== null)
    .sort((a, b) => a.takenAt.localeCompare(b.takenAt))
}

/** Latest score, band and change since the first, for the caseload column. */
export function summariseMeasure(results: readonly MeasureResult[], instrument: InstrumentId): MeasureSummary | null {
  const series = scoredSeries(results, instrument)
  const first = series[0]
  const last = series[series.length - 1]
  if (!first || !last) return null
  return { latest: last.total, band: bandOf(instrument, last.total), takenAt: last.takenAt, changeSinceFirst: series.length > 1 ? last.total - first.total : null, source: last.source }
}

/** First and last totals per measure, for the Talking Therapies classification (only measures with two or more scores). */
export function firstLastPair(results: readonly MeasureResult[]): MeasurePair {
  const pair: MeasurePair = {}
  for (const m of ['phq9', 'gad7'] as const) {
    const s = scoredSeries(results, m)
    if (s.length >= 2) pair[m] = { first: s[0]!.total, last: s[s.length - 1]!.total }
  }
  return pair
}
