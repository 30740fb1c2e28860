import { describe, expect, it } from 'vitest'
import { casenessCutOff, classifyCourse, measureChange, reliableChangePoints } from '../../../../shared/scoring/talkingTherapies'
import { plainChange } from '../../../../shared/scoring/plainChange'

describe('Talking Therapies thresholds', () => {
  it('uses caseness 10 / 8 and reliable change 6 / 4', () => {
    // NCT05134103 outcome definitions; NHS Digital IAPT outcome measures (REFERENCE.md §3)
    expect(casenessCutOff).toEqual({ phq9: 10, gad7: 8 })
    expect(reliableChangePoints).toEqual({ phq9: 6, gad7: 4 })
  })
})

describe('classifyCourse', () => {
  it('PHQ-9 15→8, GAD-7 12→6: recovery, reliable improvement and reliable recovery', () => {
    // REFERENCE.md row 13 (NHS Digital definitions + NCT05134103 thresholds)
    expect(classifyCourse({ phq9: { first: 15, last: 8 }, gad7: { first: 12, last: 6 } })).toMatchObject({
      casenessAtStart: true,
      casenessAtEnd: false,
      recovery: true,
      reliableImprovement: true,
      reliableRecovery: true,
      reliableDeterioration: false,
    })
  })

  it('PHQ-9 12→7, GAD-7 6→6: recovery without reliable improvement', () => {
    // REFERENCE.md row 14: −5 < 6
    expect(classifyCourse({ phq9: { first: 12, last: 7 }, gad7: { first: 6, last: 6 } })).toMatchObject({
      casenessAtStart: true,
      recovery: true,
      reliableImprovement: false,
      reliableRecovery: false,
    })
  })

  it('PHQ-9 8→14, GAD-7 5→5: not a case at the start, reliable deterioration', () => {
    // REFERENCE.md row 15; deterioration by "at least" 6 points (rule from memory)
    expect(classifyCourse({ phq9: { first: 8, last: 14 }, gad7: { first: 5, last: 5 } })).toMatchObject({
      casenessAtStart: false,
      recovery: null,
      reliableRecovery: null,
      reliableDeterioration: true,
      reliableImprovement: false,
    })
  })

  it('PHQ-9 9 and GAD-7 7 at the start is not a clinical case', () => {
    // REFERENCE.md row 16: cut-offs ≥ 10 and ≥ 8 (NCT05134103)
    expect(classifyCourse({ phq9: { first: 9, last: 9 }, gad7: { first: 7, last: 7 } })?.casenessAtStart).toBe(false)
    expect(classifyCourse({ phq9: { first: 10, last: 9 }, gad7: { first: 7, last: 7 } })?.casenessAtStart).toBe(true)
    expect(classifyCourse({ phq9: { first: 9, last: 9 }, gad7: { first: 8, last: 7 } })?.casenessAtStart).toBe(true)
  })

  it('counts exactly the threshold as reliable, one point less as not', () => {
    // NCT05134103: "reduction … of 6 or more, … of 4 or more"
    expect(measureChange('phq9', { first: 16, last: 10 })).toBe('reliable improvement')
    expect(measureChange('phq9', { first: 16, last: 11 })).toBe('no reliable change')
    expect(measureChange('gad7', { first: 6, last: 10 })).toBe('reliable deterioration')
    expect(measureChange('gad7', { first: 6, last: 9 })).toBe('no reliable change')
  })

  it('does not call it reliable improvement when the other measure reliably worsened', () => {
    // NHS Digital: improvement on one and no reliable deterioration on the other (detail from memory)
    const o = classifyCourse({ phq9: { first: 18, last: 10 }, gad7: { first: 6, last: 12 } })
    expect(o).toMatchObject({ reliableImprovement: false, reliableDeterioration: true })
  })

  it('decides on one measure when only one has two scores, and gives null with none', () => {
    expect(classifyCourse({ gad7: { first: 12, last: 5 } })).toMatchObject({ measures: ['gad7'], recovery: true, reliableRecovery: true })
    expect(classifyCourse({})).toBeNull()
  })
})

describe('plainChange (the person’s words)', () => {
  it('says how many points lower or higher than the first, and marks a reliable worsening', () => {
    expect(plainChange('phq9', 15, 8)).toMatchObject({ difference: -7, text: '7 points lower than your first', reliableWorsening: false })
    expect(plainChange('phq9', 8, 9).text).toBe('1 point higher than your first')
    expect(plainChange('phq9', 8, 8).text).toBe('The same as your first')
    // Talking Therapies reliable change: PHQ-9 6, GAD-7 4
    expect(plainChange('phq9', 8, 14).reliableWorsening).toBe(true)
    expect(plainChange('phq9', 8, 13).reliableWorsening).toBe(false)
    expect(plainChange('gad7', 5, 9).reliableWorsening).toBe(true)
  })
})
