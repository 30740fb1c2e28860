import type { Entry } from '../../../shared/schemas/entry.schema'
import { findRiskLanguage } from '../../../shared/content/riskPhrases'

/** Whether any text field of the entry holds risk language. Fields are checked one by one, so no phrase spans two fields. */
export function entryHasRiskLanguage(entry: Entry): boolean {
  const texts = [
    entry.body,
    entry.meetingPoint ?? '',
    ...entry.backgroundThoughts,
    ...entry.tags,
    ...entry.wants.flatMap((w) => [w.text, ...w.ladder.map((r) => r.text)]),
  ]
  return texts.some((t) => t && findRiskLanguage(t).matched)
}
