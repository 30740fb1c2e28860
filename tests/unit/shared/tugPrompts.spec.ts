import { describe, expect, it } from 'vitest'
import {
  promptFor,
  quotedRungMaxLength,
  rungPrompt,
  tugPrompts,
  tugSteps,
  wordingsFor,
  type ClimbStep,
  type TugPrompt,
} from '../../../shared/content/tugPrompts'

const climbSteps: ClimbStep[] = ['climbA', 'climbB']

/** Every title and hint the flow can show, including rung questions with and without a quoted rung. */
function everyText(): string[] {
  const texts: string[] = []
  const add = (p: TugPrompt) => texts.push(p.title, p.hint)
  for (const step of tugSteps) wordingsFor(step).forEach(add)
  for (const step of climbSteps) {
    for (let rung = 0; rung < 8; rung++) {
      add(rungPrompt(step, rung, 0))
      add(rungPrompt(step, rung, 0, 'feeling rested'))
    }
  }
  return texts
}

describe('tug prompt library', () => {
  it('has exactly the flow steps, in order', () => {
    expect(tugSteps).toEqual([
      'describe', 'distressBefore', 'wantA', 'wantB', 'climbA', 'climbB', 'meetingPoint', 'background', 'distressAfter',
    ])
    expect(Object.keys(tugPrompts).sort()).toEqual([...tugSteps].sort())
  })

  it.each(tugSteps)('gives %s at least three distinct wordings, each with a title and a one-sentence hint', (step) => {
    const list = wordingsFor(step)
    expect(list.length).toBeGreaterThanOrEqual(3)
    expect(new Set(list.map((p) => p.title)).size).toBe(list.length)
    expect(new Set(list.map((p) => p.hint)).size).toBe(list.length)
    for (const p of list) {
      expect(p.title.trim().length).toBeGreaterThan(0)
      expect(p.title.endsWith('?')).toBe(true)
      expect(p.hint.trim().length).toBeGreaterThan(0)
      expect(p.hint.length).toBeLessThanOrEqual(140)
    }
  })

  it('asks for distress on the 0–100 scale and for importance on the 0–10 scale', () => {
    for (const step of ['distressBefore', 'distressAfter'] as const) {
      for (const p of wordingsFor(step)) expect(`${p.title} ${p.hint}`).toMatch(/\b0\b.*\b100\b/)
    }
    for (const step of ['wantA', 'wantB'] as const) {
      for (const p of wordingsFor(step)) expect(`${p.title} ${p.hint}`).toMatch(/\b0\b.*\b10\b/)
    }
  })

  it('says at the meeting point that the ladders may not meet, and that this is fine', () => {
    for (const p of wordingsFor('meetingPoint')) {
      expect(p.hint).toMatch(/\b(not|don't|doesn't)\b/)
      expect(p.hint).toMatch(/\bfine\b/)
    }
  })

  it('never gives advice, judges or asks "why"', () => {
    const banned = /\b(should|must|ought|have to|need to|why|wrong with|fault|just try|stop being|calm down)\b/i
    const offending = everyText().filter((t) => banned.test(t))
    expect(offending).toEqual([])
  })
})

describe('promptFor', () => {
  it.each(tugSteps)('gives %s a different wording for consecutive seeds', (step) => {
    for (let seed = -5; seed < 20; seed++) {
      expect(promptFor(step, seed)).not.toEqual(promptFor(step, seed + 1))
    }
  })

  it('uses every wording as the seed goes round', () => {
    for (const step of tugSteps) {
      const seen = new Set(Array.from({ length: wordingsFor(step).length }, (_, seed) => promptFor(step, seed).title))
      expect(seen.size).toBe(wordingsFor(step).length)
    }
  })

  it('is deterministic for a seed, including large hashes and odd input', () => {
    expect(promptFor('describe', 123456789)).toEqual(promptFor('describe', 123456789))
    expect(promptFor('background', 2 ** 40 + 7)).toBe(promptFor('background', 2 ** 40 + 7))
    expect(wordingsFor('describe')).toContain(promptFor('describe', Number.NaN))
    expect(wordingsFor('describe')).toContain(promptFor('describe', -3.7))
  })
})

describe('rungPrompt', () => {
  it.each(climbSteps)('varies the wording from one rung to the next on %s', (step) => {
    for (let rung = 0; rung < 10; rung++) {
      expect(rungPrompt(step, rung, 4).title).not.toBe(rungPrompt(step, rung + 1, 4).title)
    }
  })

  it('does not echo the same question on both sides at the same rung', () => {
    expect(rungPrompt('climbA', 0, 0).title).not.toBe(rungPrompt('climbB', 0, 0).title)
  })

  it('quotes the rung below when given', () => {
    const p = rungPrompt('climbA', 0, 0, '  feeling rested. ')
    expect(p.title).toBe('What is “feeling rested” for?')
    expect(rungPrompt('climbA', 1, 0, 'time with Sam').title).toContain('“time with Sam”')
  })

  it('asks plainly when there is no rung to quote or it is blank', () => {
    expect(rungPrompt('climbA', 0, 0).title).toBe('What is that for?')
    expect(rungPrompt('climbA', 0, 0, '   ').title).toBe('What is that for?')
  })

  it('shortens a long rung so the question stays short', () => {
    const long = 'being able to sit down in the evening without a list of things running through my head all the time'
    const title = rungPrompt('climbB', 2, 1, long).title
    const quoted = /“(.*)”/.exec(title)?.[1] ?? ''
    expect(quoted.length).toBeLessThanOrEqual(quotedRungMaxLength + 1)
    expect(quoted.endsWith('…')).toBe(true)
  })

  it('is deterministic for a seed and rung', () => {
    expect(rungPrompt('climbB', 3, 17, 'x')).toEqual(rungPrompt('climbB', 3, 17, 'x'))
  })
})
