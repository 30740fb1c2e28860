import { describe, expect, it } from 'vitest'
import { listPhrase } from '../../../../shared/patterns/listPhrase'

describe('listPhrase', () => {
  it.each([
    [[], ''],
    [['a'], 'a'],
    [['a', 'b'], 'a and b'],
    [['a', 'b', 'c'], 'a, b and c'],
  ])('joins %j as %j', (items, text) => {
    expect(listPhrase(items)).toBe(text)
  })
})
