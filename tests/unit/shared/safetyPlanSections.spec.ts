import { describe, expect, it } from 'vitest'
import { contactLine, helpNowContacts, safetyPlanSections, telHref } from '../../../shared/content/safetyPlanSections'
import { emptySafetyPlan, safetyPlanSchema, type SafetyPlan } from '../../../shared/schemas/safetyPlan.schema'

const plan: SafetyPlan = {
  warningSigns: ['Not answering messages', '  '],
  onMyOwn: ['A long shower'],
  peopleAndPlaces: ['The library café'],
  askForHelp: [{ name: 'Noor', phone: '07700 900123', note: 'evenings' }, { name: 'Tomasz' }],
  professionals: [{ name: 'Dr Ilse Varga', phone: '020 7946 0001' }, { name: '', phone: '' }],
  saferSurroundings: ['Ask Noor to hold on to things for a while'],
  reasonToKeepGoing: 'My niece\n\nSeeing the sea again',
}

describe('safetyPlanSections', () => {
  it('lists the seven steps in the Safety Planning Intervention order (Stanley & Brown 2012)', () => {
    expect(safetyPlanSections(plan).map((s) => s.key)).toEqual([
      'warningSigns', 'onMyOwn', 'peopleAndPlaces', 'askForHelp', 'professionals', 'saferSurroundings', 'reasonToKeepGoing',
    ])
    expect(safetyPlanSections(plan).map((s) => s.title)).toEqual([
      'Signs that a hard time is starting',
      'Things I can do on my own',
      'People and places that help me feel better',
      'People I can ask for help',
      'Professionals and crisis lines',
      'Making my surroundings safer',
      'My reason to keep going',
    ])
  })

  it('renders contacts as "Name — phone (note)" and leaves out what is empty', () => {
    const sections = safetyPlanSections(plan)
    expect(sections[3]?.lines).toEqual(['Noor — 07700 900123 (evenings)', 'Tomasz'])
    // The blank contact row is not a line.
    expect(sections[4]?.lines).toEqual(['Dr Ilse Varga — 020 7946 0001'])
    expect(contactLine({ name: 'Sam', note: 'my neighbour' })).toBe('Sam (my neighbour)')
  })

  it('drops blank lines and splits the reason to keep going into its lines', () => {
    const sections = safetyPlanSections(plan)
    expect(sections[0]?.lines).toEqual(['Not answering messages'])
    expect(sections[6]?.lines).toEqual(['My niece', 'Seeing the sea again'])
  })

  it('returns every step, with no lines, for an empty plan', () => {
    const sections = safetyPlanSections(emptySafetyPlan())
    expect(sections).toHaveLength(7)
    expect(sections.every((s) => s.lines.length === 0)).toBe(true)
  })
})

describe('telHref', () => {
  it('keeps digits and a leading plus, so spaced numbers still dial', () => {
    expect(telHref('116 123')).toBe('tel:116123')
    expect(telHref('+44 (0)20 7946-0001')).toBe('tel:+4402079460001')
    expect(telHref('ask at reception')).toBeUndefined()
  })
})

describe('helpNowContacts', () => {
  it('starts with the region emergency number, then its adult crisis lines', () => {
    const uk = helpNowContacts('UK')
    expect(uk[0]).toMatchObject({ name: 'Emergency services', phone: '999' }) // REFERENCE §5: UK 999 [C]
    expect(uk.find((c) => c.name === 'Samaritans')?.phone).toBe('116 123') // REFERENCE §5: Samaritans 116 123 [C]
    expect(uk.find((c) => c.name === 'Shout')?.note).toContain('85258') // REFERENCE §5: Shout 85258 [C]
    expect(uk.some((c) => c.name === 'Childline')).toBe(false)
  })

  it('says "check locally" beside a number marked from memory', () => {
    expect(helpNowContacts('IE')[0]?.note).toContain('Check this number locally.') // REFERENCE §5: Ireland 112 [M]
  })
})

describe('safetyPlanSchema', () => {
  it('refuses a line over 500 characters with a message that says how long it may be', () => {
    const r = safetyPlanSchema.safeParse({ ...emptySafetyPlan(), onMyOwn: ['x'.repeat(501)] })
    expect(r.success).toBe(false)
    expect(r.error?.issues[0]?.path).toEqual(['onMyOwn', 0])
    expect(r.error?.issues[0]?.message).toBe('Keep each line under 500 characters.')
  })

  it('accepts a line of exactly 500 characters', () => {
    expect(safetyPlanSchema.safeParse({ ...emptySafetyPlan(), onMyOwn: ['x'.repeat(500)] }).success).toBe(true)
  })
})
