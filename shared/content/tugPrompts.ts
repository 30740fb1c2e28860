/**
 * The words of the tug flow, written for Rungs. The kinds of question (present experience, the thought in the background,
 * what a want is for, both sides of a dilemma) follow the summary in ../REFERENCE.md §7; no published wording is used.
 * Tone (DESIGN.md): plain, warm, curious; never advice, never judgement; "What is that for?", never "Why…?".
 */

/** The steps of the tug flow, in order. Every step can be skipped. */
export const tugSteps = [
  'describe',
  'distressBefore',
  'wantA',
  'wantB',
  'climbA',
  'climbB',
  'meetingPoint',
  'background',
  'distressAfter',
] as const

export type TugStep = (typeof tugSteps)[number]

/** The same as TugStep, under the name the tug flow's page and components import. */
export type TugStepId = TugStep

/** The two steps that climb a ladder, one rung at a time. */
export type ClimbStep = Extract<TugStep, 'climbA' | 'climbB'>

/** One wording of a step: a short question and one calm sentence under it. */
export interface TugPrompt {
  title: string
  hint: string
}

/** Distress is rated on the subjective-units-of-distress scale, 0–100 (DESIGN.md, distress (SUDS 0–100)). */
export const distressScale = { min: 0, max: 100 } as const

export const tugPrompts: Readonly<Record<TugStep, readonly TugPrompt[]>> = {
  describe: [
    { title: 'What is happening right now?', hint: 'Describe it as it is for you at this moment, in as much or as little detail as you like.' },
    { title: 'What is it like, right now?', hint: 'Take your time. Whatever comes to mind first is a fine place to begin.' },
    { title: 'How is it, as you sit with it now?', hint: 'Write it the way it feels from where you are, here and now.' },
    { title: 'What is on your mind about this at the moment?', hint: 'Plain words are plenty; there is no right way to put it.' },
  ],
  distressBefore: [
    { title: 'How much distress are you feeling right now?', hint: 'Pick a number from 0 to 100: 0 is completely at ease, 100 is the most upset you can imagine.' },
    { title: 'How strong is the upset at this moment?', hint: 'Anywhere from 0, calm, to 100, the worst you can picture. A rough guess is enough.' },
    { title: 'Where is your distress just now, from 0 to 100?', hint: 'Go with the first number that feels close, or leave it blank.' },
  ],
  wantA: [
    { title: 'What do you want here?', hint: 'Name one side of the pull, then say how much it matters to you, from 0 to 10.' },
    { title: 'What is one thing you are wanting in this?', hint: 'A few words is enough. Then give it a number from 0 (not at all) to 10 (a great deal).' },
    { title: 'Which want is most in view right now?', hint: 'Put it in your own words, and mark how much it matters to you from 0 to 10.' },
  ],
  wantB: [
    { title: 'What is pulling the other way?', hint: 'Name the want on the other side, and how much it matters to you, from 0 to 10.' },
    { title: 'What else do you want that sits uneasily with that?', hint: 'It may feel just as real. Give it a number from 0 to 10 for how much it matters.' },
    { title: 'What is the want on the other side of this?', hint: 'Say it plainly, and mark how much it matters to you from 0 to 10.' },
  ],
  climbA: [
    { title: 'What is that want for?', hint: 'Take it one rung at a time: each answer becomes the next step up.' },
    { title: 'What would having it give you?', hint: 'Write what comes, then ask the same of your answer. Stop whenever you like.' },
    { title: 'What matters to you about it?', hint: 'Each answer is a rung; climb as far as feels right today.' },
  ],
  climbB: [
    { title: 'And what is this other want for?', hint: 'Climb this side the same way, one rung at a time.' },
    { title: 'What would having this one give you?', hint: 'Write what comes, then ask the same of that. Stop wherever you like.' },
    { title: 'What does this side matter for?', hint: 'Each answer is another rung on this ladder, as high as feels right.' },
  ],
  meetingPoint: [
    { title: 'Where do the two ladders meet?', hint: 'Is there something higher that both sides are for? They may not meet, and that is fine.' },
    { title: 'Is there a want that both sides serve?', hint: 'Look at the top rungs of each ladder. Sometimes they lead to one place and sometimes they do not; either is fine.' },
    { title: 'What might both sides be reaching for?', hint: 'If the two ladders arrive at one higher want, name it here. If they do not, that is fine too.' },
  ],
  background: [
    { title: 'Did you notice any other thought while writing?', hint: 'Something at the edge of your mind, a passing doubt or an aside. Jot it down if you like.' },
    { title: 'Is there a thought in the background right now?', hint: 'Sometimes a quieter thought sits behind the words. What is it saying?' },
    { title: 'What went through your mind just then?', hint: 'Any pause, aside or second thought counts, however small.' },
  ],
  distressAfter: [
    { title: 'How much distress are you feeling now?', hint: 'The same scale as before: 0 is at ease, 100 is the most upset you can imagine.' },
    { title: 'Where is the upset now, from 0 to 100?', hint: 'It may have gone up, down or stayed the same. Any of those is worth knowing.' },
    { title: 'How strong is the distress at this moment?', hint: 'A rough number from 0 to 100 is enough, or leave it blank.' },
  ],
}

/** One way of asking for the next rung, with and without the rung below it quoted. */
interface RungWording {
  quoting: (prev: string) => string
  plain: string
  hint: string
}

const rungWordings: readonly RungWording[] = [
  { quoting: (prev) => `What is “${prev}” for?`, plain: 'What is that for?', hint: 'One more rung up, if it feels right.' },
  { quoting: (prev) => `What would “${prev}” give you?`, plain: 'What would having that give you?', hint: 'There is no wrong answer; write what comes.' },
  { quoting: (prev) => `If you had “${prev}”, what would that bring?`, plain: 'If you had that, what would it bring?', hint: 'You can stop climbing at any point.' },
  { quoting: (prev) => `What matters to you about “${prev}”?`, plain: 'What matters to you about that?', hint: 'Notice what comes up as you answer.' },
]

/** A quoted rung longer than this is shortened, so the question stays short on a phone. */
export const quotedRungMaxLength = 60

/** The wordings of a step, in rotation order. */
export function wordingsFor(step: TugStep): readonly TugPrompt[] {
  return tugPrompts[step]
}

/**
 * The wording of a step for this tug. `seed` is any number that changes from one tug to the next (the count of tugs so far,
 * or a hash of the entry id): consecutive seeds give different wordings. The same seed always gives the same wording.
 */
export function promptFor(step: TugStep, seed: number): TugPrompt {
  const list = tugPrompts[step]
  const chosen = list[indexFor(seed, list.length)]
  if (!chosen) throw new Error(`No wording for tug step ${step}`)
  return chosen
}

/**
 * The question for rung `rungIndex` (0 = the first rung above the want) of a climb step. Successive rungs take successive
 * wordings, starting from the seed, and the two sides start one apart so they do not echo each other. When `prev` (the
 * rung below, or the want itself for rung 0) is given, the question quotes it, shortened to quotedRungMaxLength.
 */
export function rungPrompt(step: ClimbStep, rungIndex: number, seed: number, prev?: string): TugPrompt {
  const sideOffset = step === 'climbA' ? 0 : 1
  const at = indexFor(safeInteger(seed) + safeInteger(rungIndex) + sideOffset, rungWordings.length)
  const wording = rungWordings[at]
  if (!wording) throw new Error(`No rung wording at ${at}`)
  const quoted = prev === undefined ? '' : shorten(prev)
  return { title: quoted ? wording.quoting(quoted) : wording.plain, hint: wording.hint }
}

function safeInteger(n: number): number {
  return Number.isFinite(n) ? Math.trunc(n) : 0
}

function indexFor(seed: number, length: number): number {
  return ((safeInteger(seed) % length) + length) % length
}

function shorten(text: string): string {
  const clean = text.replace(/\s+/g, ' ').replace(/[“”"]/g, '').trim().replace(/[.?!,;:]+$/, '')
  if (clean.length <= quotedRungMaxLength) return clean
  const cut = clean.slice(0, quotedRungMaxLength)
  const lastSpace = cut.lastIndexOf(' ')
  return `${(lastSpace > quotedRungMaxLength / 2 ? cut.slice(0, lastSpace) : cut).trimEnd()}…`
}
