import type { Entry } from '../schemas/entry.schema'
import { journalEntries, type JournalKind } from './journalEntries'
import { periodPhrase } from './periodPhrase'
import type { PatternPeriod } from './periodRange'

/** Where a rating sits: a moment's only rating, or the start or end of a tug. */
export type DistressPhase = 'moment' | 'before' | 'after'

export interface DistressPoint {
  entryId: string
  kind: JournalKind
  phase: DistressPhase
  /** The entry's createdAt; a tug's after-rating shares its time. */
  at: number
  value: number
}

export interface DistressSeries {
  /** Moments and tugs looked at, with or without a rating. */
  entryCount: number
  /** Oldest first; a tug's before-rating comes just ahead of its after-rating. */
  points: DistressPoint[]
  min?: number
  max?: number
  mean?: number
}

/**
 * Every distress rating in the entries: a moment's rating (stored as distressBefore), a tug's before-rating and,
 * where there is one, its after-rating. Ratings the person never chose are absent and are skipped, never read as 0.
 */
export function distressSeries(entries: readonly Entry[]): DistressSeries {
  const journal = journalEntries(entries)
  const points: DistressPoint[] = []
  for (const e of journal) {
    const base = { entryId: e.id, kind: e.kind, at: e.createdAt }
    if (e.distressBefore !== undefined) points.push({ ...base, phase: e.kind === 'tug' ? 'before' : 'moment', value: e.distressBefore })
    if (e.kind === 'tug' && e.distressAfter !== undefined) points.push({ ...base, phase: 'after', value: e.distressAfter })
  }
  if (!points.length) return { entryCount: journal.length, points }
  const values = points.map((p) => p.value)
  return {
    entryCount: journal.length,
    points,
    min: Math.min(...values),
    max: Math.max(...values),
    mean: values.reduce((sum, v) => sum + v, 0) / values.length,
  }
}

function times(n: number): string {
  return n === 1 ? 'once' : n === 2 ? 'twice' : `${n} times`
}

/** One plain sentence about the ratings: how many, their range and their average (rounded to whole points). */
export function distressSeriesSummary(series: DistressSeries, period: PatternPeriod): string {
  const { lead, nothingYet } = periodPhrase(period)
  if (!series.entryCount) return nothingYet
  const n = series.points.length
  if (!n || series.min === undefined || series.max === undefined || series.mean === undefined) {
    const entries = series.entryCount === 1 ? '1 entry was recorded' : `${series.entryCount} entries were recorded`
    return `${lead}, ${entries}, none with a distress rating.`
  }
  if (n === 1) return `${lead}, distress was recorded once, at ${series.min}.`
  if (series.min === series.max) return `${lead}, distress was recorded ${times(n)}, at ${series.min} each time.`
  return `${lead}, distress was recorded ${times(n)}, ranging from ${series.min} to ${series.max}, averaging ${Math.round(series.mean)}.`
}
