import { describe, expect, it } from 'vitest'
import { gad7Form, phq9Form, scoreOfAnswerCode } from '../../../../shared/content/measureForms'
import { measureBundle } from '../../../../shared/fhir/measureBundle'
import { readQuestionnaireResponse } from '../../../../shared/fhir/readQuestionnaireResponse'
import type { MeasureResult } from '../../../../shared/schemas/measure.schema'
import { bundleSchema, observationSchema, questionnaireResponseSchema } from './r4Shapes'

const phq: MeasureResult = {
  id: '0b5f7c38-3f1e-4c55-9d7a-2a9f4f2b6a11',
  instrument: 'phq9',
  takenAt: '2026-11-20T09:30:00.000Z',
  total: 12,
  band: 'moderate',
  prorated: false,
  selfHarm: 'none',
  source: 'person',
  // US Core QuestionnaireResponse phq-9-example answers (REFERENCE.md row 1); difficulty "Somewhat difficult"
  answers: [2, 2, 2, 2, 1, 1, 2, 0, 0],
  difficulty: 1,
}
const gad: MeasureResult = { id: 'c2d6a0e4-8b5e-4c1e-8a53-6f0c1b9d7e22', instrument: 'gad7', takenAt: '2026-11-20T09:40:00.000Z', total: 7, band: 'mild', prorated: false, selfHarm: null, source: 'person', answers: [1, 1, 1, 1, 0, 1, 2] }
const earlier: MeasureResult = { id: 'e1', instrument: 'phq9', takenAt: '2026-09-01T12:00:00.000Z', total: 17, band: 'moderately severe', prorated: false, selfHarm: 'unknown', source: 'therapist' }

const bundle = measureBundle([phq, gad, earlier], { generatedAt: new Date('2026-12-01T10:00:00Z'), subjectDisplay: 'Robin' })
const resources = bundle.entry.map((e) => e.resource)

describe('measureBundle', () => {
  it('is a valid R4 collection Bundle: required fields, one value per answer', () => {
    // HL7 FHIR R4: Bundle.type 1..1, QuestionnaireResponse.status 1..1, item.linkId 1..1, Observation.status and code 1..1
    const parsed = bundleSchema.safeParse(bundle)
    expect(parsed.error?.issues ?? []).toEqual([])
    expect(bundle.type).toBe('collection')
  })

  it('gives a QuestionnaireResponse per answered form and an Observation per total', () => {
    expect(resources.map((r) => r.resourceType)).toEqual(['QuestionnaireResponse', 'Observation', 'QuestionnaireResponse', 'Observation', 'Observation'])
  })

  it('codes the PHQ-9 with LOINC panel, item and answer codes', () => {
    // LOINC 44249-1 panel, items 44250-9 … 44260-8, answers LA6568-5 … LA6571-9 (US Core / PCO IG; REFERENCE.md §4)
    const qr = questionnaireResponseSchema.parse(resources[0])
    expect(qr.questionnaire).toContain('44249-1')
    expect(qr.status).toBe('completed')
    const linkIds = qr.item!.map((i) => i.linkId)
    expect(linkIds).toEqual(['44250-9', '44255-8', '44259-0', '44254-1', '44251-7', '44258-2', '44252-5', '44253-3', '44260-8', '69722-7'])
    const codes = qr.item!.map((i) => i.answer![0]!.valueCoding!.code)
    expect(codes.slice(0, 9)).toEqual(['LA6570-1', 'LA6570-1', 'LA6570-1', 'LA6570-1', 'LA6569-3', 'LA6569-3', 'LA6570-1', 'LA6568-5', 'LA6568-5'])
    // Difficulty "Somewhat difficult" = LA6573-5 (PCO IG)
    expect(codes[9]).toBe('LA6573-5')
    expect(qr.item!.every((i) => i.answer![0]!.valueCoding!.system === 'http://loinc.org')).toBe(true)
  })

  it('puts the total in an Observation coded 44261-6, derived from the response', () => {
    // US Core Observation-PHQ9-item-example-44261-6: total 12
    const obs = observationSchema.parse(resources[1])
    expect(obs.code.coding[0]).toMatchObject({ system: 'http://loinc.org', code: '44261-6' })
    expect(obs.valueInteger).toBe(12)
    expect(obs.category![0]!.coding[0]!.code).toBe('survey')
    expect(obs.derivedFrom![0]!.reference).toBe(bundle.entry[0]!.fullUrl)
  })

  it('codes the GAD-7 with panel 69737-5, total 70274-6 and emits LA6570-1 (never LA18938-3)', () => {
    // LOINC codes from the PCO IG GAD-7 (REFERENCE.md §4)
    const qr = questionnaireResponseSchema.parse(resources[2])
    expect(qr.questionnaire).toContain('69737-5')
    expect(qr.item!.map((i) => i.linkId)).toEqual(gad7Form.items.map((i) => i.loinc))
    expect(JSON.stringify(qr)).not.toContain('LA18938-3')
    expect(observationSchema.parse(resources[3]).code.coding[0]!.code).toBe('70274-6')
  })

  it('gives an earlier score entered by the therapist an Observation only, saying who entered it and that item 9 is unknown', () => {
    const obs = observationSchema.parse(resources[4])
    expect(obs.valueInteger).toBe(17)
    expect(obs.derivedFrom).toBeUndefined()
    expect(obs.note!.map((n) => n.text).join(' ')).toMatch(/entered by the therapist.*item 9 was not answered/s)
  })

  it('leaves a skipped item out of the response rather than answering it 0', () => {
    const b = measureBundle([{ ...phq, total: null, band: null, selfHarm: 'unknown', answers: [1, 1, 1, 1, 1, 1, 1, 1, null] }], { generatedAt: new Date() })
    const qr = questionnaireResponseSchema.parse(b.entry[0]!.resource)
    expect(qr.item!.map((i) => i.linkId)).not.toContain('44260-8')
    expect(b.entry).toHaveLength(1)
  })
})

describe('LOINC answer codes on import', () => {
  it('maps LA6568-5…LA6571-9 to 0–3', () => {
    // US Core / PCO IG (REFERENCE.md row 8)
    expect(['LA6568-5', 'LA6569-3', 'LA6570-1', 'LA6571-9'].map(scoreOfAnswerCode)).toEqual([0, 1, 2, 3])
    expect(scoreOfAnswerCode('LA0000-0')).toBeUndefined()
  })

  it('accepts LA18938-3 "More days than not" as 2 for GAD-7 item 2', () => {
    // PCO IG GAD-7 quirk for 68509-9 (REFERENCE.md §4)
    const qr = {
      resourceType: 'QuestionnaireResponse',
      questionnaire: 'http://loinc.org/q/69737-5',
      status: 'completed',
      item: [
        { linkId: '69725-0', answer: [{ valueCoding: { system: 'http://loinc.org', code: 'LA6569-3' } }] },
        { linkId: '68509-9', answer: [{ valueCoding: { system: 'http://loinc.org', code: 'LA18938-3' } }] },
      ],
    }
    expect(readQuestionnaireResponse(qr)).toEqual({ ok: true, instrument: 'gad7', answers: [1, 2, null, null, null, null, null] })
  })

  it('round-trips the exported PHQ-9 answers', () => {
    expect(readQuestionnaireResponse(resources[0])).toEqual({ ok: true, instrument: 'phq9', answers: phq.answers })
    expect(phq9Form.items).toHaveLength(9)
  })

  it('refuses other questionnaires and unknown answer codes with a message', () => {
    expect(readQuestionnaireResponse({ resourceType: 'Patient' })).toMatchObject({ ok: false })
    expect(readQuestionnaireResponse({ resourceType: 'QuestionnaireResponse', questionnaire: 'http://loinc.org/q/1-8' })).toMatchObject({ ok: false, message: expect.stringMatching(/neither/) })
    const bad = { resourceType: 'QuestionnaireResponse', questionnaire: 'http://loinc.org/q/44249-1', item: [{ linkId: '44250-9', answer: [{ valueCoding: { code: 'LA9-9' } }] }] }
    expect(readQuestionnaireResponse(bad)).toMatchObject({ ok: false })
  })
})
