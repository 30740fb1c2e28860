import { describe, expect, it } from 'vitest'
import { entryHasRiskLanguage } from '../../../shared/content/entryHasRiskLanguage'
import type { Entry } from '../../../shared/schemas/entry.schema'

const base: Entry = {
  id: '6f1c9a52-2f1b-4c0e-9d7a-0a4b1c2d3e4f', kind: 'tug', createdAt: 1, updatedAt: 1, version: 1, body: 'A quiet evening',
  wants: [{ text: 'Rest', ladder: [{ id: 'r1', text: 'Feeling steady' }] }], backgroundThoughts: [], tags: [], shares: [],
}

describe('entryHasRiskLanguage', () => {
  it('finds risk language in any field, a rung included', () => {
    expect(entryHasRiskLanguage(base)).toBe(false)
    expect(entryHasRiskLanguage({ ...base, wants: [{ text: 'Rest', ladder: [{ id: 'r1', text: 'I want to end my life' }] }] })).toBe(true)
    expect(entryHasRiskLanguage({ ...base, backgroundThoughts: ['better off dead'] })).toBe(true)
  })

  it('checks fields one by one, so words split across two fields do not join into a phrase', () => {
    expect(entryHasRiskLanguage({ ...base, body: 'I want to kill', meetingPoint: 'myself a little time' })).toBe(entryHasRiskLanguage({ ...base, body: 'I want to kill' }))
  })
})
