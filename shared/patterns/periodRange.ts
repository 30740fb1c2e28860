import { addDays, endOfDay, startOfDay, subDays, subYears } from 'date-fns'

/** The spans the Patterns page can look back over. */
export const patternPeriods = ['7d', '30d', '90d', '1y', 'all'] as const
export type PatternPeriod = (typeof patternPeriods)[number]

/** Inclusive epoch-ms bounds on an entry's createdAt. */
export interface PeriodRange {
  from: number
  to: number
}

/**
 * The time span a period covers, in the device's local time zone. A period of N days is today plus the N − 1 whole
 * days before it, so "last 7 days" starts at local midnight six days ago and ends at the end of today; a year starts
 * on the day after the same date a year ago. "All" has no bounds at all.
 */
export function periodRange(period: PatternPeriod, now: number | Date = Date.now()): PeriodRange {
  if (period === 'all') return { from: 0, to: Number.MAX_SAFE_INTEGER }
  const to = endOfDay(now).getTime()
  if (period === '1y') return { from: startOfDay(addDays(subYears(now, 1), 1)).getTime(), to }
  const days = period === '7d' ? 7 : period === '30d' ? 30 : 90
  return { from: startOfDay(subDays(now, days - 1)).getTime(), to }
}
