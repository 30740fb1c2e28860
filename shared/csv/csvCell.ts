/**
 * One CSV cell, safe to open in a spreadsheet. A cell that starts with = + - @, a tab or a carriage return could be run
 * as a formula, so it gets a leading apostrophe (OWASP "CSV Injection" guidance); then the cell is quoted per RFC 4180
 * when it holds a comma, a double quote or a line break, with double quotes doubled.
 */
export function csvCell(value: string | number | null | undefined): string {
  if (value === null || value === undefined) return ''
  let text = String(value)
  if (/^[=+\-@\t\r]/.test(text)) text = `'${text}`
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text
}

/** One CSV line of escaped cells (no line ending). */
export const csvRow = (cells: readonly (string | number | null | undefined)[]): string => cells.map(csvCell).join(',')

/** A whole CSV document: CRLF between records and after the last, as RFC 4180 describes. */
export const csvDocument = (rows: readonly (readonly (string | number | null | undefined)[])[]): string => rows.map((r) => `${csvRow(r)}\r\n`).join('')
