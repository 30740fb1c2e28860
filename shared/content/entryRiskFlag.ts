import type { Entry } from '../schemas/entry.schema'
import { selfHarmItem } from '../scoring/scoreMeasure'
import { entryHasRiskLanguage } from './entryHasRiskLanguage'

/**
 * Whether a shared copy carries a risk flag: risk language in its text, or a PHQ-9 with an answer above 0 to item 9
 * (any non-zero answer needs prompt clinical review, whatever the total: MII FHIR IG PRO PHQ-9 notes).
 */
export function entryRiskFlag(entry: Entry): boolean {
  if (entry.kind === 'measure' && entry.measure && selfHarmItem(entry.measure.instrument, entry.measure.answers) === 'flag') return true
  return entryHasRiskLanguage(entry)
}
