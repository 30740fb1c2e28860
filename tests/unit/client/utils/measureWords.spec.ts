import { describe, expect, it } from 'vitest'
import type { MeasureResult } from '../../../../shared/schemas/measure.schema'
import { firstLastPair } from '../../../../shared/scoring/measureResults'
import { bandOf } from '../../../../shared/scoring/scoreMeasure'
import { classifyCourse, measureChange } from '../../../../shared/scoring/talkingTherapies'
import { outcomeSentences, seriesSummary, signed, summaryText } from '../../../../client/utils/measureWords'

const result = (id: string, instrument: 'phq9' | 'gad7', day: string, total: number, source: 'person' | 'therapist' = 'person'): MeasureResult => ({
  id, instrument, takenAt: `${day}T12:00:00.000Z`, total, band: bandOf(instrument, total), prorated: false, selfHarm: instrument === 'phq9' ? 'none' : null, source,
})
const report = (results: MeasureResult[]) => {
  const pair = firstLastPair(results)
  return { results, outcome: classifyCourse(pair), changes: { ...(pair.phq9 ? { phq9: measureChange('phq9', pair.phq9) } : {}), ...(pair.gad7 ? { gad7: measureChange('gad7', pair.gad7) } : {}) } }
}

describe('summaryText (the caseload cell)', () => {
  it('shows latest, band and a signed change with a true minus sign', () => {
    expect(summaryText({ latest: 12, band: 'moderate', takenAt: '', changeSinceFirst: -5, source: 'person' })).toBe('12 moderate · −5')
    expect(summaryText({ latest: 9, band: 'mild', takenAt: '', changeSinceFirst: 3, source: 'person' })).toBe('9 mild · +3')
    expect(summaryText({ latest: 9, band: 'mild', takenAt: '', changeSinceFirst: null, source: 'therapist' })).toBe('9 mild')
    expect(summaryText(null)).toBe('—')
    expect(signed(0)).toBe('0')
  })
})

describe('outcomeSentences', () => {
  it('words REFERENCE row 13 (PHQ-9 15→8, GAD-7 12→6) as reliable improvement on both and reliable recovery', () => {
    const s = outcomeSentences(report([result('a', 'phq9', '2026-09-01', 15), result('b', 'gad7', '2026-09-01', 12), result('c', 'phq9', '2026-10-20', 8), result('d', 'gad7', '2026-10-20', 6)]))
    expect(s).toEqual([
      'Reliable improvement on the depression questionnaire: PHQ-9 15 → 8 (−7; 6 points count as reliable).',
      'Reliable improvement on the anxiety questionnaire: GAD-7 12 → 6 (−6; 4 points count as reliable).',
      'Reliable recovery: at caseness at the start, below caseness on both measures now, with reliable improvement.',
    ])
  })

  it('words REFERENCE row 15 (PHQ-9 8→14) as deterioration, not at caseness at the start', () => {
    const s = outcomeSentences(report([result('a', 'phq9', '2026-09-01', 8, 'therapist'), result('b', 'phq9', '2026-10-20', 14)]))
    expect(s[0]).toBe('Reliable deterioration on the depression questionnaire: PHQ-9 8 → 14 (+6; 6 points count as reliable).')
    expect(s).toContain('Not at caseness at the first scores, so recovery does not apply.')
    expect(s.at(-1)).toMatch(/^Reliable deterioration on at least one measure/)
  })

  it('says when a measure with one score is left out of the course', () => {
    const s = outcomeSentences(report([result('a', 'phq9', '2026-09-01', 12), result('b', 'phq9', '2026-10-20', 7), result('c', 'gad7', '2026-09-01', 11)]))
    expect(s).toContain('The GAD-7 has one score so far, so the course is judged on the PHQ-9 alone.')
    // REFERENCE row 14: 12→7 is recovery without reliable improvement (−5 < 6)
    expect(s).toContain('Recovery: at caseness at the start and below caseness on the PHQ-9 now, without reliable improvement.')
  })

  it('says nothing about a course with one score per measure', () => {
    expect(outcomeSentences(report([result('a', 'phq9', '2026-09-01', 12)]))).toEqual([])
  })
})

describe('seriesSummary', () => {
  it('gives the first, latest and change in words for screen readers', () => {
    const text = seriesSummary([result('a', 'gad7', '2026-09-01', 12), result('b', 'gad7', '2026-10-01', 7)], 'gad7', (d) => d.slice(0, 10))
    expect(text).toBe('GAD-7: 2 scores from 2026-09-01 to 2026-10-01; first 12 (moderate), latest 7 (mild), change −5. Caseness starts at 8.')
  })
})
