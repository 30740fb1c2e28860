import { describe, expect, it } from 'vitest'
import type { Entry } from '../../../../shared/schemas/entry.schema'
import { recurringWants, recurringWantsSummary } from '../../../../shared/patterns/recurringWants'

let seq = 0
function tug(ladders: string[][], meetingPoint?: string, kind: Entry['kind'] = 'tug'): Entry {
  seq++
  const e: Entry = {
    id: `00000000-0000-4000-8000-${String(seq).padStart(12, '0')}`,
    kind,
    createdAt: seq * 1000,
    updatedAt: 0,
    version: 1,
    body: '',
    wants: ladders.map((ladder, w) => ({ text: `want ${w}`, ladder: ladder.map((text, r) => ({ id: `r${seq}-${w}-${r}`, text })) })),
    backgroundThoughts: [],
    tags: [],
    shares: [],
  }
  if (meetingPoint !== undefined) e.meetingPoint = meetingPoint
  return e
}

describe('recurringWants', () => {
  it('groups "feeling safe", "Feeling safe." and "to feel safe" across tugs and shows the most common wording', () => {
    const r = recurringWants([
      tug([['Feeling safe.', 'rest'], ['to feel safe']]),
      tug([['feeling safe']]),
      tug([['Feeling safe.']]),
      tug([['to feel safe']]),
    ])
    expect(r.items).toEqual([{ key: 'safe', text: 'Feeling safe.', tugCount: 4, meetingPointCount: 0 }])
  })

  it('counts a tug once even when both ladders and the meeting point reach the same want', () => {
    const r = recurringWants([tug([['being heard'], ['to be heard']], 'Being heard'), tug([['feel heard']])])
    expect(r.items[0]).toMatchObject({ key: 'heard', tugCount: 2, meetingPointCount: 1 })
  })

  it('lists only wants seen in at least two tugs, most tugs first, and ignores want texts and moments', () => {
    const r = recurringWants([
      tug([['rest', 'time with friends']]),
      tug([['Rest'], ['time with friend']]),
      tug([['rest']]),
      tug([['only once']]),
      tug([['only once']], undefined, 'moment'),
    ])
    expect(r.items.map((i) => [i.text, i.tugCount])).toEqual([
      ['rest', 3],
      ['time with friends', 2],
    ])
    expect(r.items.some((i) => i.key === 'want 0')).toBe(false)
    expect(r.tugCount).toBe(4)
  })

  it('takes the earliest wording when two are used equally often', () => {
    expect(recurringWants([tug([['Peace']]), tug([['peace.']])]).items[0]!.text).toBe('Peace')
  })

  it('cuts the list at the limit but reports how many recur', () => {
    const words = ['one', 'two', 'three']
    const r = recurringWants([tug([words]), tug([words])], 2)
    expect(r.items).toHaveLength(2)
    expect(r.recurringCount).toBe(3)
  })
})

describe('recurringWantsSummary', () => {
  it('says when there are no tugs, one tug, or nothing recurring', () => {
    expect(recurringWantsSummary(recurringWants([]), '30d')).toBe('No tugs recorded in this period yet.')
    expect(recurringWantsSummary(recurringWants([tug([['rest']])]), '30d')).toBe(
      'Over the last 30 days, 1 tug was recorded. Higher wants show here once they come up in a second tug.',
    )
    expect(recurringWantsSummary(recurringWants([tug([['rest']]), tug([['sleep']])]), '7d')).toBe(
      'Over the last 7 days, 2 tugs were recorded, and no rung has come up in more than one of them.',
    )
  })

  it('names the want seen in the most tugs', () => {
    const r = recurringWants([tug([['to feel safe', 'rest']]), tug([['Feeling safe', 'rest']]), tug([['Feeling safe']])])
    expect(recurringWantsSummary(r, '90d')).toBe('Over the last 90 days, 2 higher wants came up in more than one tug. The most frequent was \u201cFeeling safe\u201d, in 3 tugs.')
  })
})
