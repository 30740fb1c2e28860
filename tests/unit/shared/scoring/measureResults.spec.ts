import { describe, expect, it } from 'vitest'
import { entryRiskFlag } from '../../../../shared/content/entryRiskFlag'
import type { Entry } from '../../../../shared/schemas/entry.schema'
import { earlierScoreRowSchema, type EarlierScoreView } from '../../../../shared/schemas/measure.schema'
import { firstLastPair, measureResultOfEarlierScore, measureResultOfEntry, summariseMeasure } from '../../../../shared/scoring/measureResults'

const base: Entry = { id: '3f0c9a52-5b1d-4c9e-9a36-0d6f8e2c7b41', kind: 'measure', createdAt: Date.UTC(2026, 10, 20, 9), updatedAt: 0, version: 1, body: '', wants: [], backgroundThoughts: [], tags: [], shares: [] }
const phq = (answers: (0 | 1 | 2 | 3 | null)[], completed = true): Entry => ({ ...base, measure: { instrument: 'phq9', answers, ...(completed ? { completedAt: base.createdAt } : {}) } })

describe('measureResultOfEntry', () => {
  it('scores a finished form from its raw answers', () => {
    // US Core phq-9-example → 12 moderate
    expect(measureResultOfEntry(phq([2, 2, 2, 2, 1, 1, 2, 0, 0]))).toMatchObject({ total: 12, band: 'moderate', selfHarm: 'none', source: 'person', takenAt: '2026-11-20T09:00:00.000Z' })
  })

  it('gives nothing for a form still in progress or another kind', () => {
    expect(measureResultOfEntry(phq([1, null, null, null, null, null, null, null, null], false))).toBeNull()
    expect(measureResultOfEntry({ ...base, kind: 'moment' })).toBeNull()
  })
})

describe('earlier scores', () => {
  const view: EarlierScoreView = { id: 'x', instrument: 'phq9', takenOn: '2026-09-01', total: 17, item9: null, enteredBy: 'Amara Quint', enteredAt: '2026-11-01T10:00:00Z' }

  it('keep an unknown item 9 unknown and are marked as entered by the therapist', () => {
    expect(measureResultOfEarlierScore(view)).toMatchObject({ total: 17, band: 'moderately severe', selfHarm: 'unknown', source: 'therapist' })
    expect(measureResultOfEarlierScore({ ...view, item9: 2 }).selfHarm).toBe('flag')
  })

  it('count change from the true first score', () => {
    const results = [measureResultOfEntry(phq([1, 1, 1, 1, 1, 1, 1, 1, 0]))!, measureResultOfEarlierScore(view)]
    expect(summariseMeasure(results, 'phq9')).toMatchObject({ latest: 8, band: 'mild', changeSinceFirst: -9, source: 'person' })
    expect(firstLastPair(results)).toEqual({ phq9: { first: 17, last: 8 } })
    expect(summariseMeasure(results, 'gad7')).toBeNull()
  })
})

describe('earlierScoreRowSchema', () => {
  it('accepts a plain row and normalises the measure name', () => {
    expect(earlierScoreRowSchema.parse({ date: '2026-09-01', measure: 'phq9', total: '17', item9: '' })).toEqual({ date: '2026-09-01', measure: 'PHQ-9', total: 17 })
    expect(earlierScoreRowSchema.parse({ date: '2026-09-01', measure: 'GAD-7', total: '8' }).measure).toBe('GAD-7')
  })

  it.each([
    [{ date: '01/09/2026', measure: 'PHQ-9', total: '5' }, 'YYYY-MM-DD'],
    [{ date: '2026-02-30', measure: 'PHQ-9', total: '5' }, 'does not exist'],
    [{ date: '2026-09-01', measure: 'BDI', total: '5' }, 'PHQ-9 or GAD-7'],
    // Kroenke 2001: PHQ-9 range 0–27; Spitzer 2006: GAD-7 range 0–21
    [{ date: '2026-09-01', measure: 'PHQ-9', total: '28' }, 'at most 27'],
    [{ date: '2026-09-01', measure: 'GAD-7', total: '22' }, 'at most 21'],
    [{ date: '2026-09-01', measure: 'GAD-7', total: '5', item9: '1' }, 'PHQ-9 only'],
    [{ date: '2026-09-01', measure: 'PHQ-9', total: 'ten' }, 'whole number'],
    [{ date: '2026-09-01', measure: 'PHQ-9', total: '-1' }, 'below 0'],
  ])('refuses %o with a clear message', (row, message) => {
    const r = earlierScoreRowSchema.safeParse(row)
    expect(r.success).toBe(false)
    expect(r.error!.issues.map((i) => i.message).join(' ')).toContain(message)
  })
})

describe('entryRiskFlag', () => {
  it('flags a PHQ-9 with item 9 above 0 whatever the total, and not one with 0 or skipped', () => {
    // MII FHIR IG PRO PHQ-9: any non-zero item 9 is a flag (REFERENCE.md row 4)
    expect(entryRiskFlag(phq([0, 0, 0, 0, 0, 0, 0, 0, 1]))).toBe(true)
    expect(entryRiskFlag(phq([3, 3, 3, 3, 3, 3, 3, 3, 0]))).toBe(false)
    expect(entryRiskFlag(phq([0, 0, 0, 0, 0, 0, 0, 0, null]))).toBe(false)
  })
})
