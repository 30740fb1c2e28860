import { describe, expect, it } from 'vitest'
import { gad7Form, phq9Form } from '../../../../shared/content/measureForms'
import type { ItemAnswer } from '../../../../shared/schemas/measure.schema'
import { bandOf, bandRanges, scoreMeasure, selfHarmItem } from '../../../../shared/scoring/scoreMeasure'

/** Answers that add up to `total` on a form of `n` items (each 0–3). */
function answersFor(total: number, n: number): ItemAnswer[] {
  return Array.from({ length: n }, (_, i) => Math.max(0, Math.min(3, total - 3 * i)) as 0 | 1 | 2 | 3)
}

describe('PHQ-9 scoring', () => {
  it('scores the US Core example 12, moderate, with no item 9 flag', () => {
    // HL7 US Core QuestionnaireResponse phq-9-example: [2,2,2,2,1,1,2,0,0] → 12 (REFERENCE.md row 1)
    const s = scoreMeasure('phq9', [2, 2, 2, 2, 1, 1, 2, 0, 0])
    expect(s).toMatchObject({ status: 'scored', total: 12, band: 'moderate', prorated: false, selfHarm: 'none' })
  })

  it('spans 0 minimal to 27 severe, and all 3s flag item 9', () => {
    // Kroenke et al. 2001: range 0–27 (REFERENCE.md row 2)
    expect(scoreMeasure('phq9', Array(9).fill(0))).toMatchObject({ total: 0, band: 'minimal', selfHarm: 'none' })
    expect(scoreMeasure('phq9', Array(9).fill(3))).toMatchObject({ total: 27, band: 'severe', selfHarm: 'flag' })
  })

  it.each([
    // Kroenke et al. 2001, cut points 5/10/15/20, non-overlapping bands (REFERENCE.md row 3)
    [4, 'minimal'],
    [5, 'mild'],
    [9, 'mild'],
    [10, 'moderate'],
    [14, 'moderate'],
    [15, 'moderately severe'],
    [19, 'moderately severe'],
    [20, 'severe'],
  ] as const)('puts a total of %i in the %s band', (total, band) => {
    expect(bandOf('phq9', total)).toBe(band)
    const s = scoreMeasure('phq9', answersFor(total, 9))
    expect(s).toMatchObject({ status: 'scored', total, band })
  })

  it('flags item 9 answered 1 even when the total is minimal', () => {
    // MII FHIR IG PRO PHQ-9 clinical notes: any non-zero item 9 needs prompt review (REFERENCE.md row 4)
    expect(scoreMeasure('phq9', [0, 0, 0, 0, 0, 0, 0, 0, 1])).toMatchObject({ total: 1, band: 'minimal', selfHarm: 'flag' })
  })

  it('never takes a skipped item 9 as 0: the form is unscored and item 9 unknown', () => {
    // common practice: item 9 is never imputed (REFERENCE.md §1a)
    const s = scoreMeasure('phq9', [1, 1, 1, 1, 1, 1, 1, 1, null])
    expect(s.status).toBe('incomplete')
    expect(s.selfHarm).toBe('unknown')
    if (s.status === 'incomplete') expect(s.message).toMatch(/question 9/)
    expect(selfHarmItem('phq9', [0, 0, 0, 0, 0, 0, 0, 0, null])).toBe('unknown')
  })

  it('prorates up to two skipped items among 1–8 from the mean of the answered ones', () => {
    // Arrieta et al. 2017 convention (REFERENCE.md §1): 7 answered summing 14 → mean 2 → 14 + 2·2 = 18
    const s = scoreMeasure('phq9', [2, 2, 2, 2, null, 2, 2, null, 2])
    expect(s).toMatchObject({ status: 'scored', total: 18, band: 'moderately severe', prorated: true, selfHarm: 'flag' })
    // one skipped: 8 answered summing 9 → 9 + 9/8 = 10.125 → 10
    expect(scoreMeasure('phq9', [1, 1, 1, 1, 1, 1, 1, null, 2])).toMatchObject({ total: 10, prorated: true })
  })

  it('refuses a PHQ-9 with three skipped items, naming them', () => {
    const s = scoreMeasure('phq9', [null, null, null, 1, 1, 1, 1, 1, 0])
    expect(s).toMatchObject({ status: 'incomplete', missing: [1, 2, 3] })
  })
})

describe('GAD-7 scoring', () => {
  it('scores the PACIO examples: 7 mild and 4 minimal', () => {
    // HL7 PACIO sample-data IG QuestionnaireResponses (REFERENCE.md rows 5 and 6)
    expect(scoreMeasure('gad7', [1, 1, 1, 1, 0, 1, 2])).toMatchObject({ status: 'scored', total: 7, band: 'mild', selfHarm: null })
    expect(scoreMeasure('gad7', [1, 0, 0, 1, 0, 1, 1])).toMatchObject({ status: 'scored', total: 4, band: 'minimal' })
  })

  it.each([
    // Spitzer et al. 2006, cut points 5/10/15 (REFERENCE.md row 7)
    [4, 'minimal'],
    [5, 'mild'],
    [9, 'mild'],
    [10, 'moderate'],
    [14, 'moderate'],
    [15, 'severe'],
    [21, 'severe'],
  ] as const)('puts a total of %i in the %s band', (total, band) => {
    expect(bandOf('gad7', total)).toBe(band)
    expect(scoreMeasure('gad7', answersFor(total, 7))).toMatchObject({ total, band })
  })

  it('refuses any skipped GAD-7 item with a clear message', () => {
    const s = scoreMeasure('gad7', [1, 1, 1, null, 1, 1, 1])
    expect(s).toMatchObject({ status: 'incomplete', missing: [4] })
    if (s.status === 'incomplete') expect(s.message).toMatch(/every question/)
  })
})

describe('forms and band ranges', () => {
  it('has 9 and 7 items with the instruments’ stems', () => {
    // Kroenke 2001; Spitzer 2006 (REFERENCE.md §1a wording)
    expect(phq9Form.items).toHaveLength(9)
    expect(gad7Form.items).toHaveLength(7)
    expect(phq9Form.stem).toBe('Over the last 2 weeks, how often have you been bothered by any of the following problems?')
    expect(gad7Form.items[6]!.text).toBe('Feeling afraid, as if something awful might happen')
    expect(phq9Form.copyright).toContain('No permission required to reproduce, translate, display or distribute')
  })

  it('covers every total exactly once', () => {
    for (const [m, max] of [['phq9', 27], ['gad7', 21]] as const) {
      const ranges = bandRanges(m)
      for (let t = 0; t <= max; t++) {
        const hits = ranges.filter((r) => t >= r.from && t <= r.to)
        expect(hits).toHaveLength(1)
        expect(hits[0]!.band).toBe(bandOf(m, t))
      }
    }
  })
})
