import { describe, expect, it } from 'vitest'
import { patternPeriods, periodRange } from '../../../../shared/patterns/periodRange'
import { periodPhrase } from '../../../../shared/patterns/periodPhrase'

// Local-time constructors, so these hold in any time zone the tests run in.
const now = new Date(2024, 5, 15, 14, 30).getTime()
const endOfToday = new Date(2024, 5, 15, 23, 59, 59, 999).getTime()

describe('periodRange', () => {
  it('covers today and the six days before it for the last 7 days', () => {
    expect(periodRange('7d', now)).toEqual({ from: new Date(2024, 5, 9).getTime(), to: endOfToday })
  })

  it('covers 30 and 90 calendar days ending today', () => {
    expect(periodRange('30d', now).from).toBe(new Date(2024, 4, 17).getTime())
    expect(periodRange('90d', now).from).toBe(new Date(2024, 2, 18).getTime())
    expect(periodRange('90d', now).to).toBe(endOfToday)
  })

  it('starts a year on the day after the same date last year', () => {
    expect(periodRange('1y', now)).toEqual({ from: new Date(2023, 5, 16).getTime(), to: endOfToday })
  })

  it('has no bounds for all time', () => {
    expect(periodRange('all', now)).toEqual({ from: 0, to: Number.MAX_SAFE_INTEGER })
  })

  it('includes an entry made late today and excludes one from the day before the period', () => {
    const { from, to } = periodRange('7d', now)
    const lateToday = new Date(2024, 5, 15, 23, 0).getTime()
    const tooEarly = new Date(2024, 5, 8, 23, 59).getTime()
    expect(lateToday >= from && lateToday <= to).toBe(true)
    expect(tooEarly >= from).toBe(false)
  })

  it('offers every period in order, each with its own lead phrase', () => {
    expect(patternPeriods).toEqual(['7d', '30d', '90d', '1y', 'all'])
    expect(new Set(patternPeriods.map((p) => periodPhrase(p).lead)).size).toBe(5)
    expect(periodPhrase('30d')).toEqual({ lead: 'Over the last 30 days', nothingYet: 'Nothing recorded in this period yet.' })
    expect(periodPhrase('all').nothingYet).toBe('Nothing recorded yet.')
  })
})
