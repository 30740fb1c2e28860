import { parse } from 'csv-parse/sync'
import { earlierScoreRowSchema, type EarlierScoreRow } from '../../../shared/schemas/measure.schema'
import type { EarlierScoreRowErrors } from '../../../shared/schemas/measureReport.schema'
import { HttpError } from '../../middleware/HttpError'

/** At most this many data rows per file: a course's intake history, not a bulk import. */
export const MAX_EARLIER_ROWS = 500
const columns = ['date', 'measure', 'total', 'item9'] as const
const required = ['date', 'measure', 'total'] as const
const headerHelp = 'The first row must name the columns: date,measure,total,item9 (item9 may be left out).'

const invalid = (message: string, rows: EarlierScoreRowErrors['rows']) => new HttpError(400, 'invalid_csv', message, { rows })

/**
 * Reads a CSV of earlier PHQ-9 / GAD-7 totals (header row required; BOM, CRLF and blank lines tolerated) and validates
 * every row with earlierScoreRowSchema. Either every row is valid and all are returned, or it throws 400 `invalid_csv`
 * with the errors of each bad row, numbered as the line in the file (the header is row 1).
 */
export function parseEarlierScoresCsv(text: string, today: string): EarlierScoreRow[] {
  let records: { record: string[]; info: { lines: number } }[]
  try {
    records = parse(text, { bom: true, info: true, skip_empty_lines: true, trim: true, relax_column_count: true }) as never
  } catch (err) {
    const line = (err as { lines?: number }).lines
    throw invalid('The file could not be read as CSV. Check for a quote mark that is not closed.', [{ row: line ?? 1, errors: ['This line could not be read as CSV.'] }])
  }
  const [head, ...body] = records
  if (!head) throw invalid('The file is empty.', [{ row: 1, errors: [headerHelp] }])
  const names = head.record.map((h) => h.toLowerCase().replace(/[\s_-]/g, ''))
  const unknown = names.filter((n) => !(columns as readonly string[]).includes(n))
  const missing = required.filter((c) => !names.includes(c))
  if (missing.length || unknown.length) {
    const errors = [headerHelp]
    if (missing.length) errors.push(`Missing column${missing.length > 1 ? 's' : ''}: ${missing.join(', ')}.`)
    if (unknown.length) errors.push(`Unknown column${unknown.length > 1 ? 's' : ''}: ${unknown.join(', ')}.`)
    throw invalid('The header row is not right.', [{ row: head.info.lines, errors }])
  }
  if (!body.length) throw invalid('The file has a header but no scores.', [{ row: head.info.lines, errors: ['Add at least one row under the header.'] }])
  if (body.length > MAX_EARLIER_ROWS) throw invalid(`Use at most ${MAX_EARLIER_ROWS} rows per file.`, [{ row: body[MAX_EARLIER_ROWS]!.info.lines, errors: [`This file has ${body.length} rows; the most is ${MAX_EARLIER_ROWS}.`] }])

  const rows: EarlierScoreRow[] = []
  const bad: EarlierScoreRowErrors['rows'] = []
  for (const { record, info } of body) {
    const cell = (c: string) => record[names.indexOf(c)]
    const errors: string[] = []
    if (record.length > names.length) errors.push(`This row has ${record.length} cells but the header has ${names.length}.`)
    const total = cell('total')
    const parsed = earlierScoreRowSchema.safeParse({ date: cell('date') ?? '', measure: cell('measure') ?? '', total: total === '' ? undefined : total, item9: cell('item9') ?? '' })
    if (parsed.success && parsed.data.date > today) errors.push(`date: ${parsed.data.date} is after today.`)
    if (!parsed.success) for (const issue of parsed.error.issues) errors.push(`${String(issue.path[0] ?? 'row')}: ${issue.message}`)
    if (errors.length) bad.push({ row: info.lines, errors })
    else if (parsed.success) rows.push(parsed.data)
  }
  if (bad.length) throw invalid(`${bad.length} row${bad.length > 1 ? 's need' : ' needs'} another look; nothing was saved.`, bad)
  return rows
}
