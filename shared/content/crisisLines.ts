/**
 * Crisis resources shown by Help now, one entry per region.
 * Sources: ../shared/REFERENCE.md §5 (each line names its own). `fromMemory` marks numbers that were not confirmed
 * in a published source when this file was reviewed; the UI shows them with "check locally".
 */
export const crisisLinesReviewedOn = '2026-12-01'

export type RegionCode = 'US' | 'CA' | 'UK' | 'IE' | 'AU' | 'NZ' | 'EU'

export interface CrisisContact {
  name: string
  /** What the line is for, in plain words. */
  detail: string
  /** Digits or short code to dial; absent when the line is text-only. */
  call?: string
  /** Short code or number for SMS, with an optional keyword. */
  text?: { to: string; body?: string }
  youth?: boolean
  fromMemory?: boolean
  source: string
}

export interface RegionResources {
  code: RegionCode
  label: string
  emergency: { number: string; fromMemory?: boolean; source: string }
  /** Other numbers that also reach emergency services. */
  alsoEmergency?: { number: string; fromMemory?: boolean }[]
  contacts: CrisisContact[]
}

export const crisisRegions: readonly RegionResources[] = [
  {
    code: 'US',
    label: 'United States',
    emergency: { number: '911', source: 'SAMHSA-derived pages' },
    contacts: [
      {
        name: '988 Suicide & Crisis Lifeline',
        detail: 'Call or text, 24/7. Press 1 for the Veterans Crisis Line, 2 for Spanish.',
        call: '988',
        text: { to: '988' },
        source: 'SAMHSA-derived pages, MHA (in service since 16 Jul 2022)',
      },
      {
        name: 'Crisis Text Line',
        detail: 'Text a trained volunteer, 24/7.',
        text: { to: '741741' },
        source: 'Crisis Text Line number',
      },
    ],
  },
  {
    code: 'CA',
    label: 'Canada',
    emergency: { number: '911', fromMemory: true, source: 'from memory' },
    contacts: [
      {
        name: '9-8-8 Suicide Crisis Helpline',
        detail: 'Call or text, English or French, 24/7.',
        call: '988',
        text: { to: '988' },
        source: 'Government of Canada release (in service since 30 Nov 2023)',
      },
    ],
  },
  {
    code: 'UK',
    label: 'United Kingdom',
    emergency: { number: '999', source: 'NHS pages' },
    alsoEmergency: [{ number: '112', fromMemory: true }],
    contacts: [
      {
        name: 'Samaritans',
        detail: 'Free to call, 24/7.',
        call: '116123',
        source: 'Samaritans',
      },
      {
        name: 'NHS 111, option 2 (England)',
        detail: 'Urgent mental-health line, 24/7.',
        call: '111',
        source: 'NHS GP practice pages, TEWV NHS trust',
      },
      {
        name: 'Shout',
        detail: 'Text support, 24/7.',
        text: { to: '85258' },
        source: 'Shout',
      },
      {
        name: 'Papyrus HOPELINE247',
        detail: 'For people under 35.',
        call: '08000684141',
        youth: true,
        source: 'Papyrus',
      },
      {
        name: 'Childline',
        detail: 'For anyone under 19.',
        call: '08001111',
        youth: true,
        source: 'Childline',
      },
    ],
  },
  {
    code: 'IE',
    label: 'Ireland',
    emergency: { number: '112', fromMemory: true, source: 'from memory' },
    alsoEmergency: [{ number: '999', fromMemory: true }],
    contacts: [
      {
        name: 'Samaritans',
        detail: 'Free to call, 24/7.',
        call: '116123',
        source: 'Samaritans, Oireachtas',
      },
      {
        name: '50808 text line',
        detail: 'Free text support, 24/7.',
        text: { to: '50808', body: 'TALK' },
        source: 'Irish Examiner, Today FM (HSE-funded)',
      },
    ],
  },
  {
    code: 'AU',
    label: 'Australia',
    emergency: { number: '000', source: 'Lifeline pages' },
    contacts: [
      {
        name: 'Lifeline',
        detail: 'Call 24/7, or text.',
        call: '131114',
        text: { to: '0477131114' },
        source: 'Lifeline H2H FAQ, Lifeline text launch',
      },
    ],
  },
  {
    code: 'NZ',
    label: 'New Zealand',
    emergency: { number: '111', source: 'NZ pages' },
    contacts: [
      {
        name: '1737, Need to Talk?',
        detail: 'Free call or text, 24/7.',
        call: '1737',
        text: { to: '1737' },
        source: 'NZ pages',
      },
      {
        name: 'Lifeline Aotearoa',
        detail: 'Free to call.',
        call: '0800543354',
        source: 'NZ pages',
      },
    ],
  },
  {
    code: 'EU',
    label: 'European Union (112)',
    emergency: { number: '112', source: 'European Commission 112 notices' },
    contacts: [],
  },
]

export function regionResources(code: RegionCode): RegionResources {
  const found = crisisRegions.find((r) => r.code === code)
  if (!found) throw new Error(`No crisis resources for region ${code}`)
  return found
}

/** Formats a dialable string for display, e.g. 116123 → "116 123". */
export function displayNumber(digits: string): string {
  const known: Record<string, string> = {
    '116123': '116 123',
    '08000684141': '0800 068 4141',
    '08001111': '0800 1111',
    '131114': '13 11 14',
    '0477131114': '0477 13 11 14',
    '0800543354': '0800 543 354',
  }
  return known[digits] ?? digits
}
