import { describe, expect, it } from 'vitest'
import { crisisLinesReviewedOn, crisisRegions, displayNumber, regionResources, type RegionCode } from '../../../shared/content/crisisLines'

// Every number below is copied from /work/shared/REFERENCE.md §5, with its status there: [C] confirmed in a
// published source, [M] from memory. The tables must list every number the data file holds, so an unreviewed
// number added there fails this test.

const regions: RegionCode[] = ['US', 'CA', 'UK', 'IE', 'AU', 'NZ', 'EU']

const emergency: { region: RegionCode; number: string; fromMemory: boolean }[] = [
  { region: 'US', number: '911', fromMemory: false }, // REFERENCE §5: US emergency 911, SAMHSA-derived pages [C]
  { region: 'CA', number: '911', fromMemory: true }, // from memory: REFERENCE §5 Canada emergency 911 [M]
  { region: 'UK', number: '999', fromMemory: false }, // REFERENCE §5: UK 999, Samaritans / NHS GP practice pages [C]
  { region: 'IE', number: '112', fromMemory: true }, // from memory: REFERENCE §5 Ireland 112 or 999 [M]
  { region: 'AU', number: '000', fromMemory: false }, // REFERENCE §5: Australia 000, Lifeline pages [C]
  { region: 'NZ', number: '111', fromMemory: false }, // REFERENCE §5: New Zealand 111, NZ pages [C]
  { region: 'EU', number: '112', fromMemory: false }, // REFERENCE §5: 112 in all member states, EC 112 notices [C]
]

const alsoEmergency: { region: RegionCode; number: string; fromMemory: boolean }[] = [
  { region: 'UK', number: '112', fromMemory: true }, // from memory: REFERENCE §5 "112 also works [M]"
  { region: 'IE', number: '999', fromMemory: true }, // from memory: REFERENCE §5 Ireland 112 or 999 [M]
]

interface Line { region: RegionCode; name: string; call?: string; shown?: string; text?: string; keyword?: string; youth?: true }

const lines: Line[] = [
  { region: 'US', name: '988 Suicide & Crisis Lifeline', call: '988', text: '988' }, // REFERENCE §5: 988 Lifeline, call or text, SAMHSA-derived pages, MHA [C]
  { region: 'US', name: 'Crisis Text Line', text: '741741' }, // REFERENCE §5: text 741741 [C]; the keyword varies [M], so none is prefilled
  { region: 'CA', name: '9-8-8 Suicide Crisis Helpline', call: '988', text: '988' }, // REFERENCE §5: 9-8-8 call or text, Govt of Canada/CNW release [C]
  { region: 'UK', name: 'Samaritans', call: '116123', shown: '116 123' }, // REFERENCE §5: Samaritans 116 123 [C]
  { region: 'UK', name: 'NHS 111, option 2 (England)', call: '111' }, // REFERENCE §5: NHS 111 option 2, NHS GP practice pages, TEWV NHS trust [C]
  { region: 'UK', name: 'Shout', text: '85258' }, // REFERENCE §5: Shout, text 85258 [C]; no keyword is prefilled
  { region: 'UK', name: 'Papyrus HOPELINE247', call: '08000684141', shown: '0800 068 4141', youth: true }, // REFERENCE §5: Papyrus HOPELINE 0800 068 4141, under 35 [C]
  { region: 'UK', name: 'Childline', call: '08001111', shown: '0800 1111', youth: true }, // REFERENCE §5: Childline 0800 1111, under 19 [C]
  { region: 'IE', name: 'Samaritans', call: '116123', shown: '116 123' }, // REFERENCE §5: Samaritans 116 123, Samaritans, Oireachtas [C]
  { region: 'IE', name: '50808 text line', text: '50808', keyword: 'TALK' }, // REFERENCE §5: text "TALK" to 50808, Irish Examiner, Today FM [C]
  { region: 'AU', name: 'Lifeline', call: '131114', shown: '13 11 14', text: '0477131114' }, // REFERENCE §5: Lifeline 13 11 14, text 0477 13 11 14, Lifeline H2H FAQ [C]
  { region: 'NZ', name: '1737, Need to Talk?', call: '1737', text: '1737' }, // REFERENCE §5: 1737 free call or text, NZ pages [C]
  { region: 'NZ', name: 'Lifeline Aotearoa', call: '0800543354', shown: '0800 543 354' }, // REFERENCE §5: Lifeline Aotearoa 0800 543 354, NZ pages [C]
]

describe('crisis lines', () => {
  it('covers exactly the regions US, CA, UK, IE, AU, NZ and EU', () => {
    expect(crisisRegions.map((r) => r.code).sort()).toEqual([...regions].sort())
    for (const code of regions) expect(regionResources(code).code).toBe(code)
  })

  it.each(emergency)('gives $region the emergency number $number', ({ region, number, fromMemory }) => {
    const e = regionResources(region).emergency
    expect(e.number).toBe(number)
    expect(e.fromMemory ?? false).toBe(fromMemory)
  })

  it('lists exactly the reviewed other emergency numbers, each marked from memory', () => {
    const actual = crisisRegions.flatMap((r) => (r.alsoEmergency ?? []).map((n) => ({ region: r.code, number: n.number, fromMemory: n.fromMemory ?? false })))
    expect(actual).toEqual(alsoEmergency)
  })

  it('lists exactly the reviewed crisis lines, in order', () => {
    expect(crisisRegions.flatMap((r) => r.contacts.map((c) => `${r.code} ${c.name}`))).toEqual(lines.map((l) => `${l.region} ${l.name}`))
  })

  it.each(lines)('gives $region $name the reviewed numbers', (line) => {
    const contact = regionResources(line.region).contacts.find((c) => c.name === line.name)
    expect(contact).toBeDefined()
    expect(contact!.call).toBe(line.call)
    expect(contact!.text?.to).toBe(line.text)
    expect(contact!.text?.body).toBe(line.keyword)
    expect(contact!.youth ?? false).toBe(line.youth ?? false)
    // Every crisis line number here is confirmed in REFERENCE §5; only some emergency numbers are from memory.
    expect(contact!.fromMemory ?? false).toBe(false)
    if (line.call && line.shown) expect(displayNumber(line.call)).toBe(line.shown)
  })

  it('flags the UK youth lines, and only those', () => {
    const youth = crisisRegions.flatMap((r) => r.contacts.filter((c) => c.youth).map((c) => `${r.code} ${c.name}`))
    expect(youth).toEqual(['UK Papyrus HOPELINE247', 'UK Childline'])
  })

  it('keeps every number as plain digits, so tel: and sms: links dial it as written', () => {
    const numbers = crisisRegions.flatMap((r) => [
      r.emergency.number,
      ...(r.alsoEmergency ?? []).map((n) => n.number),
      ...r.contacts.flatMap((c) => [c.call, c.text?.to].filter((n): n is string => n !== undefined)),
    ])
    for (const n of numbers) expect(n).toMatch(/^\d+$/)
  })

  it('names a source for every number', () => {
    for (const r of crisisRegions) {
      expect(r.emergency.source.length).toBeGreaterThan(0)
      for (const c of r.contacts) expect(c.source.length).toBeGreaterThan(0)
    }
  })

  it('records the review date as a real ISO calendar date', () => {
    expect(crisisLinesReviewedOn).toMatch(/^\d{4}-\d{2}-\d{2}$/)
    expect(new Date(`${crisisLinesReviewedOn}T00:00:00Z`).toISOString().slice(0, 10)).toBe(crisisLinesReviewedOn)
  })
})
