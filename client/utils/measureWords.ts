import type { InstrumentId } from '@shared/content/measureForms'
import type { MeasureResult, MeasureSummary } from '@shared/schemas/measure.schema'
import type { LinkMeasures } from '@shared/schemas/measureReport.schema'
import { scoredSeries } from '@shared/scoring/measureResults'
import { casenessCutOff, reliableChangePoints } from '@shared/scoring/talkingTherapies'

export const measureName: Record<InstrumentId, string> = { phq9: 'PHQ-9', gad7: 'GAD-7' }
export const measureTopic: Record<InstrumentId, string> = { phq9: 'the depression questionnaire', gad7: 'the anxiety questionnaire' }

/** A signed change with a true minus sign: "−5", "+3", "0". */
export const signed = (n: number) => (n > 0 ? `+${n}` : n < 0 ? `−${Math.abs(n)}` : '0')

/** The caseload cell: "12 moderate · −5", or "12 moderate" with a single score. */
export function summaryText(s: MeasureSummary | null): string {
  if (!s) return '—'
  return `${s.latest} ${s.band}${s.changeSinceFirst === null ? '' : ` · ${signed(s.changeSinceFirst)}`}`
}

const both = (ms: InstrumentId[]) => (ms.length === 2 ? 'both measures' : `the ${measureName[ms[0]!]}`)

/**
 * The course in plain sentences, per measure first, then the NHS Talking Therapies classes. Each sentence names the
 * scores it rests on, so the therapist can check it.
 */
export function outcomeSentences(report: LinkMeasures): string[] {
  const out: string[] = []
  for (const m of ['phq9', 'gad7'] as const) {
    const change = report.changes[m]
    const s = scoredSeries(report.results, m)
    if (!change || s.length < 2) continue
    const first = s[0]!.total
    const last = s[s.length - 1]!.total
    const what = change === 'no reliable change' ? 'No reliable change' : change === 'reliable improvement' ? 'Reliable improvement' : 'Reliable deterioration'
    out.push(`${what} on ${measureTopic[m]}: ${measureName[m]} ${first} → ${last} (${signed(last - first)}; ${reliableChangePoints[m]} points count as reliable).`)
  }
  const o = report.outcome
  if (!o) return out
  for (const m of ['phq9', 'gad7'] as const) {
    if (!o.measures.includes(m) && scoredSeries(report.results, m).length === 1)
      out.push(`The ${measureName[m]} has one score so far, so the course is judged on the ${measureName[o.measures[0]!]} alone.`)
  }
  if (!o.casenessAtStart) out.push(`Not at caseness at the first scores, so recovery does not apply.`)
  else if (o.reliableRecovery) out.push(`Reliable recovery: at caseness at the start, below caseness on ${both(o.measures)} now, with reliable improvement.`)
  else if (o.recovery) out.push(`Recovery: at caseness at the start and below caseness on ${both(o.measures)} now, without reliable improvement.`)
  else out.push(`Not recovered yet: still at caseness at the latest scores.`)
  if (o.reliableDeterioration) out.push('Reliable deterioration on at least one measure: worth talking through at the next session.')
  return out
}

/** A short text version of one measure's chart, for screen readers and print. */
export function seriesSummary(results: readonly MeasureResult[], m: InstrumentId, day: (iso: string) => string): string {
  const s = scoredSeries(results, m)
  if (!s.length) return `No ${measureName[m]} scores yet.`
  const first = s[0]!
  const last = s[s.length - 1]!
  if (s.length === 1) return `${measureName[m]}: one score, ${first.total} (${first.band}) on ${day(first.takenAt)}.`
  return `${measureName[m]}: ${s.length} scores from ${day(first.takenAt)} to ${day(last.takenAt)}; first ${first.total} (${first.band}), latest ${last.total} (${last.band}), change ${signed(last.total - first.total)}. Caseness starts at ${casenessCutOff[m]}.`
}
