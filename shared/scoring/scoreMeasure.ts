import { measureForms, phq9SelfHarmIndex, type InstrumentId } from '../content/measureForms'
import type { Band, ItemAnswer, SelfHarmItem } from '../schemas/measure.schema'

export type MeasureScore =
  | { status: 'scored'; total: number; band: Band; prorated: boolean; selfHarm: SelfHarmItem | null }
  | { status: 'incomplete'; missing: number[]; message: string; selfHarm: SelfHarmItem | null }

/**
 * Severity band of a total. PHQ-9: cut points 5, 10, 15, 20 (Kroenke, Spitzer & Williams 2001). GAD-7: cut points
 * 5, 10, 15 (Spitzer et al. 2006). The bands never overlap: a PHQ-9 of 15 is moderately severe, not moderate.
 */
export function bandOf(instrument: InstrumentId, total: number): Band {
  if (total >= 20 && instrument === 'phq9') return 'severe'
  if (total >= 15) return instrument === 'phq9' ? 'moderately severe' : 'severe'
  if (total >= 10) return 'moderate'
  if (total >= 5) return 'mild'
  return 'minimal'
}

/** Item 9 of the PHQ-9 as answered; null for the GAD-7, which has no such item. A skipped item 9 is unknown, never 0. */
export function selfHarmItem(instrument: InstrumentId, answers: readonly ItemAnswer[]): SelfHarmItem | null {
  if (instrument !== 'phq9') return null
  const a = answers[phq9SelfHarmIndex]
  if (a === null || a === undefined) return 'unknown'
  return a > 0 ? 'flag' : 'none'
}

/**
 * Totals a form. A complete form is the plain sum (Kroenke 2001; Spitzer 2006). Incomplete forms:
 * - PHQ-9: scored when at most 2 of items 1–8 are skipped and item 9 is answered, by filling each skipped item with
 *   the mean of the answered ones and rounding the total (the convention in Arrieta et al. 2017). Item 9 is never
 *   filled in, so a skipped item 9 leaves the form unscored.
 * - GAD-7: refused; no missing-item rule is named for it here.
 */
export function scoreMeasure(instrument: InstrumentId, answers: readonly ItemAnswer[]): MeasureScore {
  const form = measureForms[instrument]
  const selfHarm = selfHarmItem(instrument, answers)
  const missing = form.items.map((_, i) => i).filter((i) => answers[i] === null || answers[i] === undefined)
  const answered = form.items.map((_, i) => answers[i]).filter((a): a is 0 | 1 | 2 | 3 => a !== null && a !== undefined)
  const sum = answered.reduce<number>((s, a) => s + a, 0)
  if (missing.length === 0) return { status: 'scored', total: sum, band: bandOf(instrument, sum), prorated: false, selfHarm }

  const numbers = missing.map((i) => i + 1)
  const plural = missing.length === 1 ? 'question was' : 'questions were'
  if (instrument === 'phq9' && missing.includes(phq9SelfHarmIndex))
    return { status: 'incomplete', missing: numbers, selfHarm, message: `Not scored: ${missing.length} ${plural} skipped, including question 9, which is never guessed.` }
  if (instrument === 'phq9' && missing.length <= 2) {
    const total = Math.round(sum + (sum / answered.length) * missing.length)
    return { status: 'scored', total, band: bandOf(instrument, total), prorated: true, selfHarm }
  }
  const rule = instrument === 'phq9' ? 'A PHQ-9 is scored with at most 2 skipped (and never question 9).' : 'A GAD-7 needs every question answered.'
  return { status: 'incomplete', missing: numbers, selfHarm, message: `Not scored: ${missing.length} ${plural} skipped. ${rule}` }
}

export const bandLabel: Record<Band, string> = {
  minimal: 'minimal',
  mild: 'mild',
  moderate: 'moderate',
  'moderately severe': 'moderately severe',
  severe: 'severe',
}

/** Band edges for charts: [from, to] inclusive per band (Kroenke 2001; Spitzer 2006). */
export function bandRanges(instrument: InstrumentId): { band: Band; from: number; to: number }[] {
  return instrument === 'phq9'
    ? [
        { band: 'minimal', from: 0, to: 4 },
        { band: 'mild', from: 5, to: 9 },
        { band: 'moderate', from: 10, to: 14 },
        { band: 'moderately severe', from: 15, to: 19 },
        { band: 'severe', from: 20, to: 27 },
      ]
    : [
        { band: 'minimal', from: 0, to: 4 },
        { band: 'mild', from: 5, to: 9 },
        { band: 'moderate', from: 10, to: 14 },
        { band: 'severe', from: 15, to: 21 },
      ]
}
