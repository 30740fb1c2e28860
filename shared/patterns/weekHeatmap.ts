import { getHours, getISODay } from 'date-fns'
import type { Entry } from '../schemas/entry.schema'
import { journalEntries } from './journalEntries'
import { listPhrase } from './listPhrase'
import { periodPhrase } from './periodPhrase'
import type { PatternPeriod } from './periodRange'

/** Monday first, as ISO 8601 weeks start (common practice). */
export const weekdayLabels = ['Monday', 'Tuesday', 'Wednesday', 'Thursday', 'Friday', 'Saturday', 'Sunday'] as const

/** Four six-hour parts of the local day; `to` is exclusive. */
export const dayParts = [
  { key: 'night', label: 'Night', plural: 'nights', from: 0, to: 6 },
  { key: 'morning', label: 'Morning', plural: 'mornings', from: 6, to: 12 },
  { key: 'afternoon', label: 'Afternoon', plural: 'afternoons', from: 12, to: 18 },
  { key: 'evening', label: 'Evening', plural: 'evenings', from: 18, to: 24 },
] as const
export type DayPart = (typeof dayParts)[number]['key']

export interface HeatmapCell {
  /** 0 = Monday … 6 = Sunday. */
  weekday: number
  part: DayPart
  count: number
  /** Entries in the cell with a distress rating. */
  distressCount: number
  meanDistress?: number
}

export interface HeatmapRow {
  weekday: number
  label: (typeof weekdayLabels)[number]
  /** Night, morning, afternoon, evening. */
  cells: HeatmapCell[]
}

export interface WeekHeatmap {
  entryCount: number
  /** The largest cell count, for shading; 0 when empty. */
  maxCount: number
  /** Always seven rows, Monday first. */
  rows: HeatmapRow[]
}

/**
 * When entries are made: a 7 × 4 grid of weekday and part of the day in the device's local time zone, with the count
 * of moments and tugs in each cell and the mean of their distress at the time (a moment's rating, a tug's
 * before-rating; entries without one count but do not enter the mean).
 */
export function weekHeatmap(entries: readonly Entry[]): WeekHeatmap {
  const journal = journalEntries(entries)
  const sums = weekdayLabels.map(() => dayParts.map(() => ({ count: 0, distressCount: 0, distressSum: 0 })))
  for (const e of journal) {
    const cell = sums[getISODay(e.createdAt) - 1]![Math.floor(getHours(e.createdAt) / 6)]!
    cell.count++
    if (e.distressBefore !== undefined) {
      cell.distressCount++
      cell.distressSum += e.distressBefore
    }
  }
  let maxCount = 0
  const rows: HeatmapRow[] = weekdayLabels.map((label, weekday) => ({
    weekday,
    label,
    cells: dayParts.map((part, i) => {
      const s = sums[weekday]![i]!
      maxCount = Math.max(maxCount, s.count)
      const cell: HeatmapCell = { weekday, part: part.key, count: s.count, distressCount: s.distressCount }
      if (s.distressCount) cell.meanDistress = s.distressSum / s.distressCount
      return cell
    }),
  }))
  return { entryCount: journal.length, maxCount, rows }
}

/**
 * One or two plain sentences: how many entries, and the weekday and part of the day with the most (up to three when
 * tied; nothing is singled out when every used cell holds one entry or more than three cells tie).
 */
export function weekHeatmapSummary(map: WeekHeatmap, period: PatternPeriod): string {
  const { lead, nothingYet } = periodPhrase(period)
  if (!map.entryCount) return nothingYet
  const first = `${lead}, ${map.entryCount === 1 ? '1 entry was' : `${map.entryCount} entries were`} recorded.`
  if (map.maxCount < 2) return first
  const top = map.rows.flatMap((r) => r.cells.filter((c) => c.count === map.maxCount))
  if (top.length > 3) return first
  const names = top.map((c) => `${weekdayLabels[c.weekday]} ${dayParts.find((p) => p.key === c.part)!.plural}`)
  const verb = top.length === 1 ? 'had' : 'each had'
  return `${first} ${listPhrase(names)} ${verb} the most, with ${map.maxCount}.`
}
