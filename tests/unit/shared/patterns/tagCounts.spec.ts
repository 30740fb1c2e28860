import { describe, expect, it } from 'vitest'
import type { Entry } from '../../../../shared/schemas/entry.schema'
import { tagCounts, tagCountsSummary } from '../../../../shared/patterns/tagCounts'

let seq = 0
function tagged(...tags: string[]): Entry {
  seq++
  return {
    id: `00000000-0000-4000-8000-${String(seq).padStart(12, '0')}`,
    kind: seq % 2 ? 'moment' : 'tug',
    createdAt: seq * 1000,
    updatedAt: 0,
    version: 1,
    body: '',
    wants: [],
    backgroundThoughts: [],
    tags,
    shares: [],
  }
}

describe('tagCounts', () => {
  it('counts entries per tag, most first, ties alphabetical', () => {
    const c = tagCounts([tagged('work', 'sleep'), tagged('work'), tagged('family', 'sleep'), tagged('work'), tagged('anger')])
    expect(c.top).toEqual([
      { tag: 'work', count: 3 },
      { tag: 'sleep', count: 2 },
      { tag: 'anger', count: 1 },
      { tag: 'family', count: 1 },
    ])
    expect(c).toMatchObject({ entryCount: 5, taggedEntryCount: 5, distinct: 4 })
  })

  it('folds case and spaces, shows the most used spelling and counts a repeat on one entry once', () => {
    const c = tagCounts([tagged('Work'), tagged('work'), tagged('work ', 'WORK'), tagged()])
    expect(c.top).toEqual([{ tag: 'work', count: 3 }])
    expect(c.taggedEntryCount).toBe(3)
  })

  it('keeps the top 10 but reports how many different tags there were', () => {
    const c = tagCounts(Array.from({ length: 12 }, (_, i) => tagged(`tag${String(i).padStart(2, '0')}`)))
    expect(c.top).toHaveLength(10)
    expect(c.distinct).toBe(12)
    expect(c.top[0]!.tag).toBe('tag00')
  })
})

describe('tagCountsSummary', () => {
  it('says plainly when there is nothing, or nothing tagged', () => {
    expect(tagCountsSummary(tagCounts([]), '90d')).toBe('Nothing recorded in this period yet.')
    expect(tagCountsSummary(tagCounts([tagged()]), '90d')).toBe('Over the last 90 days, no tags were added to entries.')
  })

  it('names the three most frequent tags with their counts', () => {
    const c = tagCounts([tagged('work', 'sleep', 'family', 'anger'), tagged('work', 'sleep'), tagged('work')])
    expect(tagCountsSummary(c, '30d')).toBe('Over the last 30 days, 4 different tags were used. The most frequent were work (3), sleep (2) and anger (1).')
  })

  it('words one tag and two tags', () => {
    expect(tagCountsSummary(tagCounts([tagged('work'), tagged('work')]), '7d')).toBe('Over the last 7 days, one tag was used, on 2 entries: work.')
    expect(tagCountsSummary(tagCounts([tagged('work'), tagged('rest')]), '7d')).toBe('Over the last 7 days, 2 different tags were used. They were rest (1) and work (1).')
  })
})
