import type { Entry } from '../schemas/entry.schema'
import { journalEntries } from './journalEntries'
import { normaliseRungText } from './normaliseRungText'
import { periodPhrase } from './periodPhrase'
import type { PatternPeriod } from './periodRange'

export interface RecurringWant {
  /** The normalised text the rungs were grouped by. */
  key: string
  /** The wording the person used most often (the earliest when tied), trimmed. */
  text: string
  /** Different tugs it appeared in, as a rung or as the meeting point. */
  tugCount: number
  /** Of those, the tugs where it was the meeting point. */
  meetingPointCount: number
}

export interface RecurringWants {
  tugCount: number
  /** Groups found in at least two tugs, before the list is cut. */
  recurringCount: number
  items: RecurringWant[]
}

interface Group {
  tugs: Set<string>
  meetingPoints: Set<string>
  wordings: Map<string, number>
}

/**
 * Higher wants that come back across tugs: every rung of both ladders, and the meeting point, grouped by
 * `normaliseRungText`. A group counts each tug once however often it appears in it, and is listed when it appears in
 * at least two tugs; most tugs first, ties alphabetical. Want texts themselves (the bottom of each ladder) are left out.
 */
export function recurringWants(entries: readonly Entry[], limit = 10): RecurringWants {
  const tugs = journalEntries(entries).filter((e) => e.kind === 'tug')
  const groups = new Map<string, Group>()
  const add = (tugId: string, raw: string, isMeetingPoint: boolean) => {
    const key = normaliseRungText(raw)
    if (!key) return
    const group = groups.get(key) ?? { tugs: new Set<string>(), meetingPoints: new Set<string>(), wordings: new Map<string, number>() }
    group.tugs.add(tugId)
    if (isMeetingPoint) group.meetingPoints.add(tugId)
    const wording = raw.trim().replace(/\s+/g, ' ')
    group.wordings.set(wording, (group.wordings.get(wording) ?? 0) + 1)
    groups.set(key, group)
  }
  for (const t of tugs) {
    for (const want of t.wants) for (const rung of want.ladder) add(t.id, rung.text, false)
    if (t.meetingPoint) add(t.id, t.meetingPoint, true)
  }
  const recurring: RecurringWant[] = []
  for (const [key, g] of groups) {
    if (g.tugs.size < 2) continue
    let text = ''
    let best = 0
    for (const [wording, n] of g.wordings) if (n > best) [text, best] = [wording, n]
    recurring.push({ key, text, tugCount: g.tugs.size, meetingPointCount: g.meetingPoints.size })
  }
  recurring.sort((a, b) => b.tugCount - a.tugCount || a.text.localeCompare(b.text))
  return { tugCount: tugs.length, recurringCount: recurring.length, items: recurring.slice(0, limit) }
}

/** One or two plain sentences: how many higher wants recur, and the one seen in the most tugs. */
export function recurringWantsSummary(wants: RecurringWants, period: PatternPeriod): string {
  const { lead } = periodPhrase(period)
  if (!wants.tugCount) return period === 'all' ? 'No tugs recorded yet.' : 'No tugs recorded in this period yet.'
  const first = wants.items[0]
  if (!first) {
    if (wants.tugCount === 1) return `${lead}, 1 tug was recorded. Higher wants show here once they come up in a second tug.`
    return `${lead}, ${wants.tugCount} tugs were recorded, and no rung has come up in more than one of them.`
  }
  const count = wants.recurringCount === 1 ? '1 higher want came up' : `${wants.recurringCount} higher wants came up`
  const which = wants.recurringCount === 1 ? 'It was' : 'The most frequent was'
  return `${lead}, ${count} in more than one tug. ${which} \u201c${first.text}\u201d, in ${first.tugCount} tugs.`
}
