import { describe, expect, it } from 'vitest'
import type { MeasureResult } from '@shared/schemas/measure.schema'
import { measureRows } from '@/pdf/measureTable'

const result = (id: string, takenAt: string, total: number, source: MeasureResult['source'] = 'person'): MeasureResult => ({
  id,
  instrument: 'phq9',
  takenAt,
  total,
  band: null,
  prorated: false,
  selfHarm: 'none',
  source,
})

describe('measureRows', () => {
  const inPeriod = [result('b', '2026-11-10T09:00:00Z', 14), result('c', '2026-11-24T09:00:00Z', 9)]
  const intake = result('a', '2026-08-01T12:00:00Z', 18, 'therapist')

  it('counts change from the first score ever when it falls before the period', () => {
    const rows = measureRows(inPeriod, { phq9: intake })
    expect(rows.map((r) => r.cells[4])).toEqual(['4 points lower than your first', '9 points lower than your first'])
  })

  it('falls back to the first score in the summary without one', () => {
    const rows = measureRows(inPeriod)
    expect(rows.map((r) => r.cells[4])).toEqual(['first in this summary', '5 points lower than your first'])
  })

  it('marks a reliable worsening from the first ever (PHQ-9 +6, Talking Therapies)', () => {
    const rows = measureRows([result('d', '2026-11-20T09:00:00Z', 14)], { phq9: result('a', '2026-08-01T12:00:00Z', 8) })
    expect(rows[0]!.reliableWorsening).toBe(true)
  })
})
