import type { Entry } from '../schemas/entry.schema'
import { journalEntries } from './journalEntries'
import { listPhrase } from './listPhrase'
import { periodPhrase } from './periodPhrase'
import type { PatternPeriod } from './periodRange'

export interface TagCount {
  /** The spelling used most often (the first one seen when tied). */
  tag: string
  /** Entries carrying the tag. */
  count: number
}

export interface TagCounts {
  entryCount: number
  taggedEntryCount: number
  /** Different tags in the period, before the top list is cut. */
  distinct: number
  top: TagCount[]
}

interface Group {
  count: number
  spellings: Map<string, number>
}

/**
 * The most used tags, most entries first, ties in alphabetical order. Tags that differ only in case or surrounding
 * spaces ("Work", "work ") count as one; a tag repeated on the same entry counts once.
 */
export function tagCounts(entries: readonly Entry[], limit = 10): TagCounts {
  const journal = journalEntries(entries)
  const groups = new Map<string, Group>()
  let tagged = 0
  for (const e of journal) {
    const seen = new Set<string>()
    for (const raw of e.tags) {
      const tag = raw.trim()
      const key = tag.toLowerCase()
      if (!key || seen.has(key)) continue
      seen.add(key)
      const group = groups.get(key) ?? { count: 0, spellings: new Map<string, number>() }
      group.count++
      group.spellings.set(tag, (group.spellings.get(tag) ?? 0) + 1)
      groups.set(key, group)
    }
    if (seen.size) tagged++
  }
  const all: TagCount[] = [...groups.values()].map((g) => {
    let tag = ''
    let best = 0
    for (const [spelling, n] of g.spellings) if (n > best) [tag, best] = [spelling, n]
    return { tag, count: g.count }
  })
  all.sort((a, b) => b.count - a.count || a.tag.localeCompare(b.tag))
  return { entryCount: journal.length, taggedEntryCount: tagged, distinct: all.length, top: all.slice(0, limit) }
}

/** One or two plain sentences: how many different tags, and the three used most. */
export function tagCountsSummary(counts: TagCounts, period: PatternPeriod): string {
  const { lead, nothingYet } = periodPhrase(period)
  if (!counts.entryCount) return nothingYet
  if (!counts.distinct) return `${lead}, no tags were added to entries.`
  const top = counts.top.slice(0, 3).map((t) => `${t.tag} (${t.count})`)
  const only = counts.top[0]
  if (counts.distinct === 1 && only) return `${lead}, one tag was used, on ${only.count === 1 ? '1 entry' : `${only.count} entries`}: ${only.tag}.`
  const most = counts.distinct === 2 ? 'They were' : 'The most frequent were'
  return `${lead}, ${counts.distinct} different tags were used. ${most} ${listPhrase(top)}.`
}
