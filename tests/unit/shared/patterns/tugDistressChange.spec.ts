import { describe, expect, it } from 'vitest'
import type { Entry } from '../../../../shared/schemas/entry.schema'
import { tugDistressChange, tugDistressChangeSummary } from '../../../../shared/patterns/tugDistressChange'

let seq = 0
function tug(distressBefore?: number, distressAfter?: number, over: Partial<Entry> = {}): Entry {
  seq++
  const e: Entry = {
    id: `00000000-0000-4000-8000-${String(seq).padStart(12, '0')}`,
    kind: 'tug',
    createdAt: seq * 1000,
    updatedAt: 0,
    version: 1,
    body: '',
    wants: [],
    backgroundThoughts: [],
    tags: [],
    shares: [],
    ...over,
  }
  if (distressBefore !== undefined) e.distressBefore = distressBefore
  if (distressAfter !== undefined) e.distressAfter = distressAfter
  return e
}

describe('tugDistressChange', () => {
  it('compares only tugs with both ratings and counts down, up and same', () => {
    const c = tugDistressChange([tug(70, 40), tug(50, 60), tug(30, 30), tug(80), tug(undefined, 20), tug(60, 20, { kind: 'moment' })])
    expect(c).toEqual({ tugCount: 5, n: 3, down: 1, up: 1, same: 1, meanBefore: 50, meanAfter: 130 / 3, meanChange: -20 / 3 })
  })

  it('reports a negative mean change when distress was lower at the end', () => {
    expect(tugDistressChange([tug(80, 50), tug(60, 50)]).meanChange).toBe(-20)
  })

  it('has no means when no tug has both ratings', () => {
    const c = tugDistressChange([tug(40)])
    expect(c.n).toBe(0)
    expect(c.meanChange).toBeUndefined()
  })
})

describe('tugDistressChangeSummary', () => {
  it('says when there are no tugs, or none with both ratings', () => {
    expect(tugDistressChangeSummary(tugDistressChange([]), '30d')).toBe('No tugs recorded in this period yet.')
    expect(tugDistressChangeSummary(tugDistressChange([tug(40)]), '7d')).toBe('Over the last 7 days, no tug has distress noted both before and after.')
  })

  it('gives the averages, the difference and the direction counts', () => {
    const text = tugDistressChangeSummary(tugDistressChange([tug(70, 40), tug(50, 60), tug(30, 30), tug(90, 50)]), '90d')
    expect(text).toBe(
      'Over the last 90 days, 4 tugs have distress noted before and after; on average it went from 60 to 45 (15 points lower). ' +
        'It went down in 2, up in 1 and stayed the same in 1.',
    )
  })

  it('words a single tug, and a rise, without judgement', () => {
    expect(tugDistressChangeSummary(tugDistressChange([tug(40, 41)]), 'all')).toBe('So far, 1 tug has distress noted before and after: it went from 40 to 41, 1 point higher.')
  })
})
