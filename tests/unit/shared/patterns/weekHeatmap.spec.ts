import { describe, expect, it } from 'vitest'
import type { Entry } from '../../../../shared/schemas/entry.schema'
import { weekHeatmap, weekHeatmapSummary } from '../../../../shared/patterns/weekHeatmap'

let seq = 0
function at(date: Date, distressBefore?: number, kind: Entry['kind'] = 'moment'): Entry {
  seq++
  const e: Entry = {
    id: `00000000-0000-4000-8000-${String(seq).padStart(12, '0')}`,
    kind,
    createdAt: date.getTime(),
    updatedAt: 0,
    version: 1,
    body: '',
    wants: [],
    backgroundThoughts: [],
    tags: [],
    shares: [],
  }
  if (distressBefore !== undefined) e.distressBefore = distressBefore
  return e
}

// 1 January 2024 was a Monday. Local-time constructors keep these true in any time zone.
describe('weekHeatmap', () => {
  it('always has seven rows, Monday first, each with night, morning, afternoon and evening', () => {
    const map = weekHeatmap([])
    expect(map.rows.map((r) => r.label)).toEqual(['Monday', 'Tuesday', 'Wednesday', 'Thursday', 'Friday', 'Saturday', 'Sunday'])
    expect(map.rows.every((r) => r.cells.map((c) => c.part).join() === 'night,morning,afternoon,evening')).toBe(true)
    expect(map.maxCount).toBe(0)
  })

  it('puts a Monday 19:30 local entry in the Monday evening cell with its mean distress', () => {
    const map = weekHeatmap([at(new Date(2024, 0, 1, 19, 30), 40), at(new Date(2024, 0, 8, 18, 0), 60), at(new Date(2024, 0, 8, 23, 59))])
    const cell = map.rows[0]!.cells[3]!
    expect(cell).toEqual({ weekday: 0, part: 'evening', count: 3, distressCount: 2, meanDistress: 50 })
    expect(map.maxCount).toBe(3)
  })

  it('puts the part boundaries at 6, 12 and 18 local time, and Sunday last', () => {
    const map = weekHeatmap([
      at(new Date(2024, 0, 7, 5, 59)),
      at(new Date(2024, 0, 7, 6, 0)),
      at(new Date(2024, 0, 7, 12, 0)),
      at(new Date(2024, 0, 7, 17, 59)),
      at(new Date(2024, 0, 7, 18, 0)),
    ])
    expect(map.rows[6]!.label).toBe('Sunday')
    expect(map.rows[6]!.cells.map((c) => c.count)).toEqual([1, 1, 2, 1])
    expect(map.rows[6]!.cells[0]!.meanDistress).toBeUndefined()
  })

  it('leaves out measures', () => {
    expect(weekHeatmap([at(new Date(2024, 0, 1, 9), 10, 'measure')]).entryCount).toBe(0)
  })
})

describe('weekHeatmapSummary', () => {
  it('says plainly when nothing was recorded', () => {
    expect(weekHeatmapSummary(weekHeatmap([]), '7d')).toBe('Nothing recorded in this period yet.')
  })

  it('names the busiest weekday and part of the day', () => {
    const map = weekHeatmap([at(new Date(2024, 0, 1, 20)), at(new Date(2024, 0, 8, 21)), at(new Date(2024, 0, 5, 9))])
    expect(weekHeatmapSummary(map, '30d')).toBe('Over the last 30 days, 3 entries were recorded. Monday evenings had the most, with 2.')
  })

  it('names up to three tied cells, and none when every entry is on its own', () => {
    const tied = weekHeatmap([at(new Date(2024, 0, 1, 20)), at(new Date(2024, 0, 8, 21)), at(new Date(2024, 0, 5, 9)), at(new Date(2024, 0, 12, 10))])
    expect(weekHeatmapSummary(tied, 'all')).toBe('So far, 4 entries were recorded. Monday evenings and Friday mornings each had the most, with 2.')
    expect(weekHeatmapSummary(weekHeatmap([at(new Date(2024, 0, 1, 3))]), '1y')).toBe('Over the last year, 1 entry was recorded.')
  })
})
