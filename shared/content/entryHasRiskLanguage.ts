import type { Entry } from '../schemas/entry.schema'
import { findRiskLanguage } from './riskPhrases'

/**
 * Whether any text field of the entry holds risk language. Fields are checked one by one, so no phrase spans two
 * fields. The server sets the share's risk flag with it, and the share previews use it to say so beforehand.
 */
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
