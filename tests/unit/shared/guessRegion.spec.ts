import { describe, expect, it } from 'vitest'
import { guessRegion } from '../../../shared/content/guessRegion'

describe('guessRegion', () => {
  it.each([
    ['en-US', 'US'],
    ['en-GB', 'UK'],
    ['fr-CA', 'CA'],
    ['en-IE', 'IE'],
    ['en-AU', 'AU'],
    ['en-NZ', 'NZ'],
    ['de-DE', 'EU'],
    ['fr', 'EU'],
  ])('maps %s to %s', (locale, region) => {
    expect(guessRegion([locale])).toBe(region)
  })

  it.each([['ja-JP'], ['not a locale!'], ['']])('returns undefined for %j', (locale) => {
    expect(guessRegion([locale])).toBeUndefined()
  })

  it('returns undefined for no locales at all', () => {
    expect(guessRegion([])).toBeUndefined()
  })

  it('uses the first locale that names a supported country', () => {
    expect(guessRegion(['ja-JP', 'garbage!', 'en-NZ', 'en-US'])).toBe('NZ')
  })
})
