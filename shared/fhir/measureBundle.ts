import { difficultyQuestion, frequencyOptions, measureForms } from '../content/measureForms'
import type { MeasureResult } from '../schemas/measure.schema'

const LOINC = 'http://loinc.org'
// LOINC publishes its panels as FHIR Questionnaires under this canonical base (from memory).
const loincQuestionnaire = (panel: string) => `http://loinc.org/q/${panel}`

type Coding = { system: string; code: string; display: string }
export type FhirResource = Record<string, unknown> & { resourceType: string; id: string }
export interface FhirBundle {
  resourceType: 'Bundle'
  type: 'collection'
  timestamp: string
  entry: { fullUrl: string; resource: FhirResource }[]
}

export interface MeasureBundleOptions {
  generatedAt: Date
  /** Shown as subject.display; no identifiers leave the device or the server. */
  subjectDisplay?: string
}

const loinc = (code: string, display: string): Coding => ({ system: LOINC, code, display })
/** A valid RFC 4122 urn for fullUrl, derived from the result's own id so a re-export names the same resources. */
const urn = (id: string, suffix: string) => `urn:uuid:${uuidLike(`${id}:${suffix}`)}`

/**
 * A FHIR R4 Bundle (type collection) of the results: each result with answers becomes a QuestionnaireResponse whose
 * items carry the LOINC item codes as linkIds and the LOINC answer codes (REFERENCE.md §4); each result with a total
 * becomes an Observation (LOINC 44261-6 or 70274-6, category survey) derived from it. An earlier score entered by the
 * therapist has no answers, so it gives an Observation only, with a note saying who entered it.
 */
export function measureBundle(results: readonly MeasureResult[], opts: MeasureBundleOptions): FhirBundle {
  const entry: FhirBundle['entry'] = []
  const subject = opts.subjectDisplay ? { subject: { display: opts.subjectDisplay } } : {}
  for (const r of results) {
    const form = measureForms[r.instrument]
    let qrUrl: string | undefined
    if (r.answers) {
      qrUrl = urn(r.id, 'qr')
      const items = form.items.flatMap((item, i) => {
        const a = r.answers![i]
        if (a === null || a === undefined) return []
        const option = frequencyOptions[a]!
        return [{ linkId: item.loinc, text: item.text, answer: [{ valueCoding: loinc(option.code, option.display) }] }]
      })
      const difficulty = r.difficulty !== undefined ? difficultyQuestion.options[r.difficulty] : undefined
      if (difficulty) items.push({ linkId: difficultyQuestion.loinc, text: difficultyQuestion.text, answer: [{ valueCoding: loinc(difficulty.code, difficulty.display) }] })
      entry.push({
        fullUrl: qrUrl,
        resource: {
          resourceType: 'QuestionnaireResponse',
          id: uuidLike(`${r.id}:qr`),
          questionnaire: loincQuestionnaire(form.panelLoinc),
          status: 'completed',
          ...subject,
          authored: r.takenAt,
          item: items,
        },
      })
    }
    if (r.total === null) continue
    entry.push({
      fullUrl: urn(r.id, 'obs'),
      resource: {
        resourceType: 'Observation',
        id: uuidLike(`${r.id}:obs`),
        status: 'final',
        category: [{ coding: [{ system: 'http://terminology.hl7.org/CodeSystem/observation-category', code: 'survey', display: 'Survey' }] }],
        code: { coding: [loinc(form.totalLoinc, form.totalDisplay)], text: `${form.name} total score` },
        ...subject,
        effectiveDateTime: r.takenAt,
        valueInteger: r.total,
        ...(r.band ? { interpretation: [{ text: `${r.band} (${form.name} severity band)` }] } : {}),
        ...(qrUrl ? { derivedFrom: [{ reference: qrUrl }] } : {}),
        ...(notes(r).length ? { note: notes(r).map((text) => ({ text })) } : {}),
      },
    })
  }
  return { resourceType: 'Bundle', type: 'collection', timestamp: opts.generatedAt.toISOString(), entry }
}

function notes(r: MeasureResult): string[] {
  const out: string[] = []
  if (r.source === 'therapist') out.push('Earlier score entered by the therapist from a previous record.')
  if (r.prorated) out.push('Total prorated from the answered items (at most two skipped; item 9 never imputed).')
  if (r.selfHarm === 'unknown') out.push('PHQ-9 item 9 was not answered; it is unknown, not 0.')
  return out
}

/** Deterministic UUID-shaped id (FNV-1a based); FHIR ids allow [A-Za-z0-9-.]{1,64}. Not for security. */
function uuidLike(seed: string): string {
  const parts: string[] = []
  for (let k = 0; k < 4; k++) {
    let h = 0x811c9dc5 ^ k
    for (let i = 0; i < seed.length; i++) h = Math.imul(h ^ seed.charCodeAt(i), 0x01000193) >>> 0
    parts.push(h.toString(16).padStart(8, '0'))
  }
  const hex = parts.join('')
  return `${hex.slice(0, 8)}-${hex.slice(8, 12)}-4${hex.slice(13, 16)}-a${hex.slice(17, 20)}-${hex.slice(20, 32)}`
}
