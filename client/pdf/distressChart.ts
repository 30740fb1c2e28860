import { format } from 'date-fns'
import type { DistressPoint } from '@shared/patterns/distressSeries'
import { pdfPalette, type SummaryLayout } from './summaryLayout'

const CHART_H = 150
const AXIS_W = 28

/**
 * Distress 0–100 over the period, drawn with pdf-lib lines and points: every rating as a dot, a line through each day's
 * mean. With fewer than two ratings a sentence says what there is instead.
 */
export function drawDistressChart(layout: SummaryLayout, points: readonly DistressPoint[], from: number, to: number): void {
  if (points.length < 2) {
    layout.paragraph(points.length === 1 ? `Distress was rated once in this period, at ${points[0]!.value}.` : 'No distress ratings in this period.', { color: pdfPalette.inkSoft })
    return
  }
  const soft = { size: 8, color: pdfPalette.inkSoft }
  layout.ensure(CHART_H + 34)
  const page = layout.page
  const x0 = layout.left + AXIS_W
  const x1 = layout.right - 6
  const yTop = layout.y - 8
  const y0 = yTop - CHART_H
  const span = Math.max(1, to - from)
  const xOf = (t: number) => x0 + ((Math.min(Math.max(t, from), to) - from) / span) * (x1 - x0)
  const yOf = (v: number) => y0 + (v / 100) * CHART_H

  for (const v of [0, 25, 50, 75, 100]) {
    page.drawLine({ start: { x: x0, y: yOf(v) }, end: { x: x1, y: yOf(v) }, thickness: v === 0 ? 0.8 : 0.4, color: v === 0 ? pdfPalette.inkSoft : pdfPalette.line })
    const label = String(v)
    layout.drawClean(label, x0 - 5 - layout.widthOf(label, 8), yOf(v) - 2.5, soft, page)
  }
  page.drawLine({ start: { x: x0, y: y0 }, end: { x: x0, y: yTop }, thickness: 0.8, color: pdfPalette.inkSoft })

  // One mean per local day, joined by a line, so a busy day reads as one step.
  const days = new Map<string, { at: number; sum: number; n: number }>()
  for (const p of points) {
    const key = format(p.at, 'yyyy-MM-dd')
    const d = days.get(key) ?? { at: new Date(`${key}T12:00:00`).getTime(), sum: 0, n: 0 }
    d.sum += p.value
    d.n += 1
    days.set(key, d)
  }
  const means = [...days.values()].sort((a, b) => a.at - b.at)
  for (let i = 1; i < means.length; i++) {
    const a = means[i - 1]!
    const b = means[i]!
    page.drawLine({ start: { x: xOf(a.at), y: yOf(a.sum / a.n) }, end: { x: xOf(b.at), y: yOf(b.sum / b.n) }, thickness: 1.4, color: pdfPalette.primary })
  }
  for (const p of points) page.drawCircle({ x: xOf(p.at), y: yOf(p.value), size: 1.8, color: pdfPalette.rung })

  const ticks = [from, from + span / 2, to]
  ticks.forEach((t, i) => {
    const label = layout.clean(format(t, 'd MMM'))
    const w = layout.widthOf(label, 8)
    const x = i === 0 ? x0 : i === 2 ? x1 - w : xOf(t) - w / 2
    layout.drawClean(label, x, y0 - 11, soft, page)
  })
  layout.y = y0 - 16
  layout.paragraph('Dots: each distress rating (0-100). Line: the mean of each day.', soft)
}
