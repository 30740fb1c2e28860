import { csvDocument } from '../../../shared/csv/csvCell'
import type { MeasureResult } from '../../../shared/schemas/measure.schema'

const measureName = { phq9: 'PHQ-9', gad7: 'GAD-7' } as const
const sourceWords = { therapist: 'entered by therapist', person: 'by the person' } as const

/**
 * A person's measure history as CSV, oldest first: date, measure, total, band, source, item9 (blank when unknown or not a
 * PHQ-9), person. Every cell goes through csvCell, so a display name such as "=HYPERLINK(…)" cannot run as a formula.
 */
export function measuresCsv(results: readonly MeasureResult[], item9: ReadonlyMap<string, number | null>, personName: string): string {
  const head = ['date', 'measure', 'total', 'band', 'source', 'item9', 'person']
  const rows = results.map((r) => [
    r.takenAt.slice(0, 10),
    measureName[r.instrument],
    r.total,
    r.band,
    sourceWords[r.source],
    r.instrument === 'phq9' ? (item9.get(r.id) ?? null) : null,
    personName,
  ])
  return csvDocument([head, ...rows])
}
