import type { EntryInput, Want } from '@shared/schemas/entry.schema'

// Seeded, so every run searches the same journal and figures compare across runs.
export function seededRandom(seed: number): () => number {
  let a = seed >>> 0
  return () => {
    a = (a + 0x6d2b79f5) >>> 0
    let t = a
    t = Math.imul(t ^ (t >>> 15), t | 1)
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61)
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296
  }
}

const FEELINGS = 'anxious angry sad tired calm hopeful ashamed guilty lonely relieved nervous irritated overwhelmed numb restless proud grateful embarrassed frustrated scared jealous content hurt worried tense panicky low flat uneasy disappointed resentful confused safe steady heavy raw shaky edgy gloomy cheerful annoyed'.split(' ')
const PEOPLE = 'mother father sister brother partner boss colleague friend neighbour son daughter therapist doctor teacher cousin grandmother flatmate manager nurse aunt uncle husband wife child coach landlord stranger'.split(' ')
const PLACES = 'work home office kitchen bus train car shop supermarket park gym school hospital bedroom garden station street cafe pub library bathroom clinic church beach'.split(' ')
const ACTIVITIES = 'meeting dinner lunch breakfast phone call email message argument walk run shower sleep nap cooking cleaning shopping driving commute presentation interview appointment deadline exam party visit chat text holiday weekend birthday laundry bills budget homework rehearsal'.split(' ')
const TIMES = 'morning afternoon evening night tonight yesterday today monday tuesday wednesday thursday friday saturday sunday early late weekend midnight dawn'.split(' ')
const BODY = 'chest stomach shoulders jaw head hands breath heart throat neck back legs'.split(' ')
const VERBS = 'felt noticed thought wanted tried said shouted cried laughed froze avoided ignored cancelled waited remembered worried decided asked told left stayed snapped apologised listened hid smiled sighed paced scrolled ate skipped forgot planned managed'.split(' ')
const FILLER = 'the a and but then so because after before when while again still just really almost never always maybe about with without into over under around through my his her their our it this that very quite too much little bit lot'.split(' ')
// Words of values, written only in rungs and meeting points (never in a body), so a hit has to come through the ladder text.
const RUNG_WORDS = 'rehearse breathe boundaries closeness respected heard belonging freedom rest honesty fairness safety kindness trust peace recognition connection autonomy competence dignity acceptance understanding warmth security approval fun meaning purpose growth'.split(' ')
const WANT_WORDS = 'speak up keep peace say no ask help leave early stay finish skip rest call back apologise push through explain step away take break stand ground hide'.split(' ')
// Words that appear in a handful of entries only: the rare-word query.
export const RARE_WORDS = ['lighthouse', 'harmonica', 'zeppelin', 'marmalade', 'quokka']

export const VOCABULARY = [...new Set([...FEELINGS, ...PEOPLE, ...PLACES, ...ACTIVITIES, ...TIMES, ...BODY, ...VERBS, ...FILLER, ...RUNG_WORDS, ...WANT_WORDS])]
export const TAGS = ['work', 'family', 'sleep', 'health', 'money', 'friends', 'partner', 'school', 'body', 'anger', 'anxiety', 'mood']

const DAY = 24 * 60 * 60 * 1000
export const SPAN_MS = 2 * 365 * DAY

export function makeGenerator(seed: number) {
  const rand = seededRandom(seed)
  // Squaring skews picks toward the front of each list, so some words are common and others rare, as in real writing.
  const pick = <T>(list: readonly T[], skew = true): T => list[Math.floor((skew ? rand() ** 2 : rand()) * list.length)]!
  const chance = (p: number) => rand() < p

  function sentence(): string {
    const parts = [pick(FILLER), pick(PEOPLE), pick(VERBS), pick(FILLER), pick(ACTIVITIES), 'at', pick(PLACES), pick(TIMES), 'and', pick(VERBS), pick(FEELINGS)]
    if (chance(0.4)) parts.push('in my', pick(BODY))
    if (chance(0.3)) parts.push(pick(FILLER), pick(FEELINGS))
    const s = parts.join(' ')
    return s.charAt(0).toUpperCase() + s.slice(1) + '.'
  }

  function body(targetChars: number): string {
    let text = ''
    while (text.length < targetChars) text += (text ? ' ' : '') + sentence()
    return text
  }

  function tags(): string[] {
    const n = Math.floor(rand() * 4)
    return [...new Set(Array.from({ length: n }, () => pick(TAGS)))]
  }

  function want(): Want {
    const words = Array.from({ length: 2 + Math.floor(rand() * 3) }, () => pick(WANT_WORDS, false))
    const ladder = Array.from({ length: 1 + Math.floor(rand() * 4) }, () => ({
      id: crypto.randomUUID(),
      text: `${pick(['feeling', 'being', 'having', 'more'], false)} ${pick(RUNG_WORDS)} ${chance(0.3) ? 'with ' + pick(PEOPLE) : ''}`.trim(),
    }))
    return { text: words.join(' '), importance: Math.floor(rand() * 11), ladder }
  }

  function distress(): number | undefined {
    return chance(0.7) ? Math.round(rand() * 20) * 5 : undefined
  }

  /** A realistic moment as a person types it: about 200 characters and a few tags. */
  function moment(createdAt?: number): EntryInput {
    const before = distress()
    return {
      kind: 'moment',
      body: body(140 + Math.floor(rand() * 60)),
      ...(before !== undefined && { distressBefore: before }),
      wants: [],
      backgroundThoughts: [],
      tags: tags(),
      ...(createdAt !== undefined && { createdAt }),
    }
  }

  function tug(createdAt: number): EntryInput {
    const before = distress()
    const after = before !== undefined && chance(0.6) ? Math.max(0, before - Math.round(rand() * 6) * 5) : undefined
    return {
      kind: 'tug',
      body: body(60 + Math.floor(rand() * 200)),
      ...(before !== undefined && { distressBefore: before }),
      ...(after !== undefined && { distressAfter: after }),
      wants: [want(), want()],
      ...(chance(0.7) && { meetingPoint: `${pick(['a', 'some'], false)} ${pick(RUNG_WORDS)} for ${pick(PEOPLE)} and me` }),
      backgroundThoughts: Array.from({ length: Math.floor(rand() * 3) }, () => sentence()),
      tags: tags(),
      createdAt,
    }
  }

  /** `count` entries spread evenly at random over the two years before `end`, about one tug in three. */
  function journal(count: number, end: number): EntryInput[] {
    const out: EntryInput[] = []
    for (let i = 0; i < count; i++) {
      const createdAt = end - Math.floor(rand() * SPAN_MS)
      const e = chance(0.35) ? tug(createdAt) : moment(createdAt)
      // A rare word in one entry of about 2 000, so each shows up a few times in 10 000.
      if (chance(RARE_WORDS.length / 2000)) e.body += ` ${pick(RARE_WORDS, false)} again.`
      out.push(e)
    }
    return out
  }

  return { moment, tug, journal }
}
