import type { Entry } from '../schemas/entry.schema'
import { journalEntries } from './journalEntries'
import { periodPhrase } from './periodPhrase'
import type { PatternPeriod } from './periodRange'

export interface TugDistressChange {
  /** Tugs in the period, rated or not. */
  tugCount: number
  /** Tugs with both a before- and an after-rating; only these are compared. */
  n: number
  meanBefore?: number
  meanAfter?: number
  /** Mean of (after − before): below 0 means distress was lower at the end of the tug. */
  meanChange?: number
  down: number
  up: number
  same: number
}

/** Compares distress at the start and end of each tug that has both ratings. */
export function tugDistressChange(entries: readonly Entry[]): TugDistressChange {
  const tugs = journalEntries(entries).filter((e) => e.kind === 'tug')
  const pairs: [number, number][] = []
  for (const t of tugs) if (t.distressBefore !== undefined && t.distressAfter !== undefined) pairs.push([t.distressBefore, t.distressAfter])
  const result: TugDistressChange = { tugCount: tugs.length, n: pairs.length, down: 0, up: 0, same: 0 }
  if (!pairs.length) return result
  let before = 0
  let after = 0
  for (const [b, a] of pairs) {
    before += b
    after += a
    if (a < b) result.down++
    else if (a > b) result.up++
    else result.same++
  }
  result.meanBefore = before / pairs.length
  result.meanAfter = after / pairs.length
  result.meanChange = (after - before) / pairs.length
  return result
}

function difference(from: number, to: number): string {
  const d = to - from
  if (d === 0) return 'no different on average'
  const points = Math.abs(d) === 1 ? '1 point' : `${Math.abs(d)} points`
  return `${points} ${d < 0 ? 'lower' : 'higher'}`
}

/**
 * One or two plain sentences: how many tugs have both ratings, the average before and after (whole points; the
 * difference is taken from the rounded averages so the sentence adds up), and how many went down, up or stayed level.
 */
export function tugDistressChangeSummary(change: TugDistressChange, period: PatternPeriod): string {
  const { lead } = periodPhrase(period)
  if (!change.tugCount) return period === 'all' ? 'No tugs recorded yet.' : 'No tugs recorded in this period yet.'
  if (!change.n || change.meanBefore === undefined || change.meanAfter === undefined) {
    return `${lead}, no tug has distress noted both before and after.`
  }
  const before = Math.round(change.meanBefore)
  const after = Math.round(change.meanAfter)
  if (change.n === 1) {
    const d = after - before
    return `${lead}, 1 tug has distress noted before and after: it went from ${before} to ${after}${d === 0 ? '' : `, ${difference(before, after)}`}.`
  }
  const diff = before === after ? '' : ` (${difference(before, after)})`
  return (
    `${lead}, ${change.n} tugs have distress noted before and after; on average it went from ${before} to ${after}${diff}. ` +
    `It went down in ${change.down}, up in ${change.up} and stayed the same in ${change.same}.`
  )
}
