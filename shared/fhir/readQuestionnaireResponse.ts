import { measureForms, scoreOfAnswerCode, type InstrumentId } from '../content/measureForms'
import type { ItemAnswer } from '../schemas/measure.schema'

export type ReadResult = { ok: true; instrument: InstrumentId; answers: ItemAnswer[] } | { ok: false; message: string }

interface QrLike {
  resourceType?: unknown
  questionnaire?: unknown
  item?: { linkId?: unknown; answer?: { valueCoding?: { system?: unknown; code?: unknown } }[] }[]
}

/**
 * Reads the answers of a PHQ-9 or GAD-7 QuestionnaireResponse coded with LOINC. Items are matched by their LOINC code
 * as linkId; answer codes map through scoreOfAnswerCode, which also accepts LA18938-3 ("More days than not", used by
 * one IG for GAD-7 item 2). An item that is absent stays null (never 0).
 */
export function readQuestionnaireResponse(resource: unknown): ReadResult {
  const qr = resource as QrLike
  if (!qr || qr.resourceType !== 'QuestionnaireResponse') return { ok: false, message: 'This is not a QuestionnaireResponse.' }
  const canonical = typeof qr.questionnaire === 'string' ? qr.questionnaire : ''
  const form = Object.values(measureForms).find((f) => canonical.includes(f.panelLoinc))
  if (!form) return { ok: false, message: 'The questionnaire is neither the PHQ-9 (44249-1) nor the GAD-7 (69737-5).' }
  const answers: ItemAnswer[] = form.items.map(() => null)
  for (const item of qr.item ?? []) {
    const index = form.items.findIndex((f) => f.loinc === item.linkId || f.linkId === item.linkId)
    if (index < 0) continue
    const coding = item.answer?.[0]?.valueCoding
    const score = typeof coding?.code === 'string' ? scoreOfAnswerCode(coding.code) : undefined
    if (score === undefined) return { ok: false, message: `Item ${String(item.linkId)} has an answer code Rungs does not know.` }
    answers[index] = score
  }
  return { ok: true, instrument: form.id, answers }
}
