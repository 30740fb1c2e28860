import { describe, expect, it } from 'vitest'
import type { Entry } from '../../../../shared/schemas/entry.schema'
import { journalEntries } from '../../../../shared/patterns/journalEntries'

function entry(id: string, kind: Entry['kind'], createdAt: number): Entry {
  return { id, kind, createdAt, updatedAt: 0, version: 1, body: '', wants: [], backgroundThoughts: [], tags: [], shares: [] }
}

describe('journalEntries', () => {
  it('keeps moments and tugs, oldest first, ties by id, without changing the input', () => {
    const input = [entry('c', 'tug', 20), entry('m', 'measure', 5), entry('b', 'moment', 20), entry('a', 'moment', 10), entry('s', 'safetyPlan', 1)]
    expect(journalEntries(input).map((e) => e.id)).toEqual(['a', 'b', 'c'])
    expect(input[0]!.id).toBe('c')
  })
})
