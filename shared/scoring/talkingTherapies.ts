import type { InstrumentId } from '../content/measureForms'

/**
 * NHS Talking Therapies for anxiety and depression (England) outcome rules, as defined by NHS Digital's IAPT
 * outcome measures and the thresholds in NCT05134103: caseness PHQ-9 ≥ 10 and/or GAD-7 ≥ 8; reliable change 6 points
 * on the PHQ-9 and 4 on the GAD-7. Scores are first against last.
 */
export const casenessCutOff: Record<InstrumentId, number> = { phq9: 10, gad7: 8 }
export const reliableChangePoints: Record<InstrumentId, number> = { phq9: 6, gad7: 4 }

export interface FirstLast {
  first: number
  last: number
}
export type MeasurePair = Partial<Record<InstrumentId, FirstLast>>

export interface TalkingTherapiesOutcome {
  casenessAtStart: boolean
  casenessAtEnd: boolean
  /** Null when the person was not at caseness at the start: they are left out of the recovery rate. */
  recovery: boolean | null
  reliableImprovement: boolean
  reliableDeterioration: boolean
  /** Null like recovery. */
  reliableRecovery: boolean | null
  /** The measures the outcome was computed from (those with a first and a last score). */
  measures: InstrumentId[]
}

export type MeasureChange = 'reliable improvement' | 'reliable deterioration' | 'no reliable change'

/** Change on one measure: "at least" the reliable-change points either way. */
export function measureChange(instrument: InstrumentId, { first, last }: FirstLast): MeasureChange {
  const step = reliableChangePoints[instrument]
  if (first - last >= step) return 'reliable improvement'
  if (last - first >= step) return 'reliable deterioration'
  return 'no reliable change'
}

const isCase = (pair: MeasurePair, pick: 'first' | 'last') =>
  (Object.keys(pair) as InstrumentId[]).some((m) => pair[m]![pick] >= casenessCutOff[m])

/**
 * Classifies a course from its first and last scores. With both measures present this is the PHQ-9 + GAD-7 pair rule;
 * with one, that one alone decides. Reliable improvement = a reliable fall on at least one measure and no reliable rise
 * on the other; reliable deterioration = a reliable rise on at least one (the "on the other" wording is from memory).
 * Returns null when no measure has two scores.
 */
export function classifyCourse(pair: MeasurePair): TalkingTherapiesOutcome | null {
  const measures = (Object.keys(pair) as InstrumentId[]).filter((m) => pair[m] !== undefined)
  if (!measures.length) return null
  const changes = measures.map((m) => measureChange(m, pair[m]!))
  const casenessAtStart = isCase(pair, 'first')
  const casenessAtEnd = isCase(pair, 'last')
  const reliableDeterioration = changes.includes('reliable deterioration')
  const reliableImprovement = changes.includes('reliable improvement') && !reliableDeterioration
  const recovery = casenessAtStart ? !casenessAtEnd : null
  const reliableRecovery = recovery === null ? null : recovery && reliableImprovement
  return { casenessAtStart, casenessAtEnd, recovery, reliableImprovement, reliableDeterioration, reliableRecovery, measures }
}
