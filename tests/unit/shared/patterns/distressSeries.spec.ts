import { describe, expect, it } from 'vitest'
import type { Entry } from '../../../../shared/schemas/entry.schema'
import { distressSeries, distressSeriesSummary } from '../../../../shared/patterns/distressSeries'

let seq = 0
function entry(over: Partial<Entry>): Entry {
  seq++
  return {
    id: `00000000-0000-4000-8000-${String(seq).padStart(12, '0')}`,
    kind: 'moment',
    createdAt: new Date(2024, 5, seq % 28 + 1, 10).getTime(),
    updatedAt: 0,
    version: 1,
    body: '',
    wants: [],
    backgroundThoughts: [],
    tags: [],
    shares: [],
    ...over,
  }
}

describe('distressSeries', () => {
  it('gives one point per moment rating and a before and after point per tug, oldest first', () => {
    const tug = entry({ kind: 'tug', createdAt: 2000, distressBefore: 70, distressAfter: 40 })
    const moment = entry({ createdAt: 1000, distressBefore: 55 })
    const s = distressSeries([tug, moment])
    expect(s.points.map((p) => [p.entryId, p.phase, p.value])).toEqual([
      [moment.id, 'moment', 55],
      [tug.id, 'before', 70],
      [tug.id, 'after', 40],
    ])
    expect(s.points[2]!.at).toBe(2000)
  })

  it('skips ratings that were never chosen instead of reading them as 0', () => {
    const s = distressSeries([
      entry({ createdAt: 1 }),
      entry({ kind: 'tug', createdAt: 2, distressBefore: 30 }),
      entry({ kind: 'tug', createdAt: 3, distressAfter: 20 }),
    ])
    expect(s.entryCount).toBe(3)
    expect(s.points.map((p) => `${p.phase}:${p.value}`)).toEqual(['before:30', 'after:20'])
    expect(s.min).toBe(20)
  })

  it('reports min, max and mean over all points', () => {
    const s = distressSeries([entry({ distressBefore: 20 }), entry({ kind: 'tug', distressBefore: 85, distressAfter: 40 })])
    expect(s).toMatchObject({ min: 20, max: 85, mean: 145 / 3 })
  })

  it('leaves out measures and the safety plan', () => {
    const s = distressSeries([entry({ kind: 'measure', distressBefore: 50 }), entry({ kind: 'safetyPlan', distressBefore: 10 })])
    expect(s.entryCount).toBe(0)
    expect(s.points).toHaveLength(0)
    expect(s.mean).toBeUndefined()
  })
})

describe('distressSeriesSummary', () => {
  it('says plainly when nothing was recorded', () => {
    expect(distressSeriesSummary(distressSeries([]), '30d')).toBe('Nothing recorded in this period yet.')
    expect(distressSeriesSummary(distressSeries([]), 'all')).toBe('Nothing recorded yet.')
  })

  it('says when entries exist but none has a rating', () => {
    expect(distressSeriesSummary(distressSeries([entry({}), entry({})]), '7d')).toBe('Over the last 7 days, 2 entries were recorded, none with a distress rating.')
  })

  it('gives count, range and rounded average', () => {
    const values = [20, 85, 48, 40]
    const s = distressSeries(values.map((v) => entry({ distressBefore: v })))
    expect(distressSeriesSummary(s, '30d')).toBe('Over the last 30 days, distress was recorded 4 times, ranging from 20 to 85, averaging 48.')
  })

  it('words a single rating and a repeated one without a range', () => {
    expect(distressSeriesSummary(distressSeries([entry({ distressBefore: 40 })]), '1y')).toBe('Over the last year, distress was recorded once, at 40.')
    expect(distressSeriesSummary(distressSeries([entry({ distressBefore: 40 }), entry({ distressBefore: 40 })]), 'all')).toBe('So far, distress was recorded twice, at 40 each time.')
  })
})
