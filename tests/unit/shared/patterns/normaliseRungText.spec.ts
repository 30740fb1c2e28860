import { describe, expect, it } from 'vitest'
import { normaliseRungText } from '../../../../shared/patterns/normaliseRungText'

describe('normaliseRungText', () => {
  it.each([['feeling safe'], ['Feeling safe.'], ['to feel safe'], ['  To  feel SAFE!  '], ['Being safe'], ['So I can feel safe'], ['safe']])(
    'brings %j down to "safe"',
    (text) => {
      expect(normaliseRungText(text)).toBe('safe')
    },
  )

  it('drops leading articles and purpose words but keeps them inside the text', () => {
    expect(normaliseRungText('The time to rest')).toBe('time to rest')
    expect(normaliseRungText('a sense of the future')).toBe('sense of the future')
  })

  it('folds a simple plural s on each word, but not ss, us, is or short words', () => {
    expect(normaliseRungText('Close friends')).toBe('close friend')
    expect(normaliseRungText('friend')).toBe('friend')
    expect(normaliseRungText('less stress')).toBe('less stress')
    expect(normaliseRungText('focus on this')).toBe('focus on this')
    expect(normaliseRungText('yes')).toBe('yes')
  })

  it('removes accents and apostrophes and treats other punctuation as space', () => {
    expect(normaliseRungText('Café time')).toBe('cafe time')
    expect(normaliseRungText("People's trust")).toBe('people trust')
    expect(normaliseRungText('calm—and—rested')).toBe('calm and rested')
  })

  it('always keeps the last word and returns "" for text without letters', () => {
    expect(normaliseRungText('To be')).toBe('be')
    expect(normaliseRungText(' ...! ')).toBe('')
  })

  it('does no stemming beyond the plural fold', () => {
    expect(normaliseRungText('safety')).not.toBe(normaliseRungText('safe'))
  })
})
