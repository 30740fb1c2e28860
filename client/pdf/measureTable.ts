import { format } from 'date-fns'
import { measureForms, type InstrumentId } from '@shared/content/measureForms'
import type { MeasureResult } from '@shared/schemas/measure.schema'
import { plainChange } from '@shared/scoring/plainChange'
import { scoredSeries } from '@shared/scoring/measureResults'
import { pdfPalette, type SummaryLayout } from './summaryLayout'

const columns = [
  { label: 'Date', width: 0.17 },
  { label: 'Measure', width: 0.21 },
  { label: 'Score', width: 0.12 },
  { label: 'Band', width: 0.18 },
  { label: 'Change from first', width: 0.32 },
] as const

type FirstScores = Partial<Record<InstrumentId, MeasureResult>>

/**
 * One row per result, oldest first: date, measure, score, band and plain change from the first score of that measure —
 * the first ever when given (it may predate the period), else the first in the summary.
 */
export function measureRows(results: readonly MeasureResult[], firstScores: FirstScores = {}): { cells: string[]; reliableWorsening: boolean }[] {
  const sorted = [...results].sort((a, b) => a.takenAt.localeCompare(b.takenAt))
  return sorted.map((r) => {
    const form = measureForms[r.instrument]
    const given = firstScores[r.instrument]
    const first = given && given.total !== null ? { id: given.id, total: given.total } : scoredSeries(results, r.instrument)[0]
    const change = r.total !== null && first && first.id !== r.id ? plainChange(r.instrument, first.total, r.total) : null
    return {
      cells: [
        format(new Date(r.takenAt), 'd MMM yyyy'),
        r.source === 'therapist' ? `${form.name}\nentered by your therapist` : form.name,
        r.total === null ? 'not scored' : `${r.total} of ${form.maxTotal}${r.prorated ? '*' : ''}`,
        r.band ?? '-',
        change ? change.text : r.total !== null && first?.id === r.id ? (given ? 'first score' : 'first in this summary') : '-',
      ],
      reliableWorsening: change?.reliableWorsening ?? false,
    }
  })
}

export function drawMeasureTable(layout: SummaryLayout, results: readonly MeasureResult[], firstScores: FirstScores = {}): void {
  if (!results.length) {
    layout.paragraph('No questionnaires chosen for this summary.', { color: pdfPalette.inkSoft })
    return
  }
  const size = 9.5
  const lh = layout.lineHeight({ size })
  const xs: number[] = []
  let x = layout.left
  for (const c of columns) {
    xs.push(x)
    x += c.width * layout.contentWidth
  }
  const widthOf = (i: number) => columns[i]!.width * layout.contentWidth - 6
  const header = () => {
    layout.ensure(lh * 3)
    layout.y -= lh
    columns.forEach((c, i) => layout.drawClean(layout.clean(c.label), xs[i]!, layout.y + 3, { size, bold: true, color: pdfPalette.inkSoft }))
    layout.y -= 3
    layout.rule()
  }
  header()
  const rows = measureRows(results, firstScores)
  for (const row of rows) {
    const wrapped = row.cells.map((cell, i) => layout.wrap(cell, widthOf(i), { size }))
    const h = Math.max(...wrapped.map((w) => w.length)) * lh + 4
    if (layout.y - h < layout.bottom) {
      layout.addPage()
      header()
    }
    const top = layout.y
    wrapped.forEach((lines, i) =>
      lines.forEach((line, j) => layout.drawClean(line, xs[i]!, top - lh * (j + 1) + 3, { size, color: i === 1 && j > 0 ? pdfPalette.inkSoft : pdfPalette.ink })),
    )
    layout.y = top - h
    layout.rule()
  }
  layout.gap(4)
  const notes: string[] = []
  if (results.some((r) => r.prorated)) notes.push('* Scored with one or two questions skipped, filled in from the mean of the others (Arrieta et al. 2017).')
  if (rows.some((r) => r.reliableWorsening)) notes.push('A rise this size is worth talking over with your therapist.')
  const flagged = results.filter((r) => r.selfHarm === 'flag')
  if (flagged.length)
    notes.push(`On ${flagged.map((r) => format(new Date(r.takenAt), 'd MMM')).join(', ')}, the PHQ-9 question about thoughts of being better off dead or of hurting yourself was answered above "Not at all".`)
  notes.push('Bands: PHQ-9 (Kroenke, Spitzer & Williams 2001) and GAD-7 (Spitzer et al. 2006).')
  for (const n of notes) layout.paragraph(n, { size: 8.5, color: pdfPalette.inkSoft })
}
