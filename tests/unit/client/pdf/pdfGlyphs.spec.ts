import { describe, expect, it } from 'vitest'
import { cleanText, needsExt, textRuns } from '@/pdf/pdfGlyphs'
import { loraCoverage } from './summaryFixtures'

const coverage = loraCoverage()

describe('cleanText with Lora latin + latin-ext', () => {
  it('keeps letters Lora has, from both files: é, ł, ő, en dash and curly quotes', () => {
    expect(cleanText('Café – Łódź “quoted” it’s Erdős', coverage)).toBe('Café – Łódź “quoted” it’s Erdős')
  })

  it('drops emoji, skin tones, flags and zero-width characters without throwing', () => {
    expect(cleanText('ok 😀👍🏽 🇬🇧 go\u200Bod\u200D day\uFE0F', coverage)).toBe('ok   good day')
  })

  it('writes ≥, ≤ and → out in ASCII', () => {
    expect(cleanText('distress ≥ 80 → call; ≤ 20', coverage)).toBe('distress >= 80 -> call; <= 20')
  })

  it('turns CJK and other letters Lora lacks into ?', () => {
    expect(cleanText('日本 ok ש', coverage)).toBe('?? ok ?')
  })

  it('composes decomposed accents so they draw as one letter', () => {
    expect(cleanText('Cafe\u0301', coverage)).toBe('Café')
  })

  it('never throws on lone surrogates, control characters or very long input', () => {
    const nasty = '\uD800 a\u0000b\u0007 \uDFFF' + '🙂'.repeat(5000)
    expect(() => cleanText(nasty, coverage)).not.toThrow()
    expect(cleanText(nasty, coverage)).toBe('? a b  ?')
  })

  it('splits runs between the latin and latin-ext files', () => {
    expect(textRuns('Łódź', coverage)).toEqual([
      { slot: 'ext', text: 'Ł' },
      { slot: 'latin', text: 'ód' },
      { slot: 'ext', text: 'ź' },
    ])
    expect(needsExt(['plain text'], coverage)).toBe(false)
    expect(needsExt(['plain', 'Łódź'], coverage)).toBe(true)
  })
})
