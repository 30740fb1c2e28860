import { describe, expect, it } from 'vitest'
import { findRiskLanguage, normaliseRiskText, riskPatterns } from '../../../shared/content/riskPhrases'

// The sentences below are written for these tests; the phrase list is common practice, not a published list, and is to be
// reviewed with clinicians (see shared/content/riskPhrases.ts).

describe('normaliseRiskText', () => {
  it('lower-cases, drops apostrophes, spells out "wanna" and splits sentences', () => {
    expect(normaliseRiskText('I DON’T  wanna go—really!! Not today')).toBe('i dont want to go really . not today')
    expect(normaliseRiskText("can't, won't; my self")).toBe('cant wont . myself')
  })
})

describe('findRiskLanguage', () => {
  it.each([
    'I want to kill myself',
    'I keep thinking about ending my life',
    "I don't want to be here anymore",
    'I DON’T WANT TO BE HERE ANY MORE.',
    'thinking of hurting myself',
    "I've been cutting again",
    'suicidal',
    'Feeling pretty suicidal tonight',
    "Maybe I'd be better off dead",
    'honestly I would be better off dead',
    'There is no reason to live',
    "I've got nothing to live for",
    'I wanna die',
    'Sometimes I just want to die.',
    'I wish I was dead',
    'I wish I were dead',
    'I think about suicide a lot',
    'I want to end it all',
    'I feel like killing myself',
    'I had the urge to harm myself',
    'I self-harmed last night',
    'the self harm urges are back',
    'I keep cutting myself',
    'I hope I don’t wake up tomorrow',
    'I wish I could go to sleep and never wake up',
    "I don't want to live anymore",
    'I dont want to live.',
    'life is not worth living',
    "Life's not worth living",
    'They would be better off without me',
    'I have thought about taking an overdose',
    'I want to take my own life',
    'I keep thinking about ending things',
    'I can’t go on living like this',
    'I wanted to hurt myself on purpose',
    'I tried to kill my self',
  ])('finds risk language in %j', (sentence) => {
    const result = findRiskLanguage(sentence)
    expect(result.matched).toBe(true)
    expect(result.phrases.length).toBeGreaterThan(0)
  })

  it.each([
    "I'm killing it at work",
    'this deadline is killing me',
    'I could die laughing',
    'I was killing myself laughing at that video',
    "I'm dead tired",
    'a shot of espresso before the meeting',
    'cut the onions and fry them',
    'I cut myself shaving this morning',
    'I keep cutting myself on the kitchen knives, so clumsy',
    'I hurt myself at the gym',
    "I'm dying to see that film",
    'We watched Suicide Squad last night',
    'My phone battery died on the way home',
    "I'd kill for a coffee right now",
    "I don't want to live in the city anymore",
    'I shot myself in the foot with that email',
    'I want to cut back on sugar',
    "I've been cutting carbs again",
    'I want to diet before the summer',
    'I overdosed on chocolate at the party',
    'The plant on my desk is dead',
    "I'm dead set on finishing the marathon",
    'I want to take my life back',
    "I've been cutting myself off from friends",
    'I want to die of embarrassment',
    'Killer headache today',
    "There's no reason to live in London on my salary",
    'I hurt myself falling off my bike',
    'I tried to cut myself a slice of cake',
    "I don't want to wake up early tomorrow",
    'I am ending things with my boyfriend, thinking about ending things with him for weeks',
    'The film ends with everyone dead',
  ])('finds nothing in the ordinary sentence %j', (sentence) => {
    expect(findRiskLanguage(sentence)).toEqual({ matched: false, phrases: [] })
  })

  it('reports each matched phrase once, as normalised text', () => {
    const result = findRiskLanguage('I want to die. I want to die. Better off DEAD.')
    expect(result.phrases).toEqual(['want to die', 'better off dead'])
  })

  it('finds a phrase inside a longer entry and across line breaks', () => {
    const entry = 'Work was loud again.\nOn the bus home I kept thinking\nI don’t want to be here anymore.\nThen I made tea.'
    expect(findRiskLanguage(entry).matched).toBe(true)
  })

  it('does not join words across a sentence break', () => {
    expect(findRiskLanguage("I don't want to live. In London, I mean").matched).toBe(true)
    expect(findRiskLanguage("I don't want to live in London").matched).toBe(false)
  })

  it('returns nothing for empty or blank text', () => {
    expect(findRiskLanguage('')).toEqual({ matched: false, phrases: [] })
    expect(findRiskLanguage('   \n ')).toEqual({ matched: false, phrases: [] })
  })

  it('gives every pattern a label and no pattern a global flag (exec must not keep state between calls)', () => {
    for (const p of riskPatterns) {
      expect(p.label.length).toBeGreaterThan(0)
      expect(p.pattern.global).toBe(false)
      expect(p.pattern.sticky).toBe(false)
    }
    expect(findRiskLanguage('suicidal').matched).toBe(true)
    expect(findRiskLanguage('suicidal').matched).toBe(true)
  })
})
