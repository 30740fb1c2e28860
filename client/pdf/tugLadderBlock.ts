import type { Want } from '@shared/schemas/entry.schema'
import { pdfPalette, type SummaryLayout } from './summaryLayout'

const GUTTER = 18
const RUNG_GAP = 5
const BAR = 2.5
const TEXT = { size: 9.5 }
const LABEL = { size: 7.5, color: pdfPalette.inkSoft }
const WANT = { size: 9.5, bold: true }

interface Column {
  rungs: string[][]
  label: string[]
  want: string[]
  height: number
}

const sideLabel = (side: number, w: Want | undefined) =>
  `${side === 0 ? 'In focus' : 'Pulling the other way'}${w?.importance !== undefined ? ` · matters ${w.importance}/10` : ''}`

/**
 * The two ladders of a tug side by side, as the app draws them: each rung a short bar with its text, the lowest rung
 * just above its want at the bottom, and the meeting point a bar across both at the top. Too tall for one page, the
 * ladders are written as lists instead.
 */
export function planTugLadders(layout: SummaryLayout, wants: readonly Want[], meetingPoint: string | undefined): { height: number; draw(): void } {
  const colW = (layout.contentWidth - GUTTER) / 2
  const lh = layout.lineHeight(TEXT)
  const llh = layout.lineHeight(LABEL)
  const columns: Column[] = [0, 1].map((side) => {
    const w = wants[side]
    const rungs = (w?.ladder ?? []).map((r) => layout.wrap(r.text || ' ', colW - 6, TEXT))
    const label = layout.wrap(sideLabel(side, w), colW, LABEL)
    const want = layout.wrap(w?.text || '-', colW, WANT)
    const height = rungs.reduce((h, lines) => h + lines.length * lh + BAR + RUNG_GAP, 0) + 6 + label.length * llh + want.length * lh
    return { rungs, label, want, height }
  })
  const meetLines = meetingPoint ? layout.wrap(meetingPoint, layout.contentWidth - 20, TEXT) : []
  const meetH = meetingPoint ? llh + meetLines.length * lh + 14 : 0
  const ladderH = Math.max(...columns.map((c) => c.height))
  const blockH = meetH + ladderH + 6

  if (blockH > layout.pageRoom) return { height: layout.pageRoom + 1, draw: () => drawAsLists(layout, wants, meetingPoint) }
  return { height: blockH, draw: () => drawBlock(layout, columns, meetingPoint, meetLines, meetH, blockH, colW) }
}

function drawBlock(layout: SummaryLayout, columns: Column[], meetingPoint: string | undefined, meetLines: string[], meetH: number, blockH: number, colW: number): void {
  const lh = layout.lineHeight(TEXT)
  const llh = layout.lineHeight(LABEL)
  layout.ensure(blockH)
  const page = layout.page
  const top = layout.y
  if (meetingPoint) {
    page.drawRectangle({ x: layout.left, y: top - meetH, width: layout.contentWidth, height: meetH, color: pdfPalette.paperDeep })
    page.drawLine({ start: { x: layout.left, y: top }, end: { x: layout.right, y: top }, thickness: 3, color: pdfPalette.rung })
    page.drawLine({ start: { x: layout.left, y: top - meetH }, end: { x: layout.right, y: top - meetH }, thickness: 3, color: pdfPalette.rung })
    const centre = (s: string, size: number, bold = false) => layout.left + (layout.contentWidth - layout.widthOf(s, size, bold)) / 2
    let y = top - 6 - llh
    layout.drawClean('Meeting point', centre('Meeting point', LABEL.size), y + 2, LABEL, page)
    for (const line of meetLines) {
      y -= lh
      layout.drawClean(line, centre(line, TEXT.size), y + 3, TEXT, page)
    }
  }
  const bottom = top - blockH + 2
  columns.forEach((col, side) => {
    const x = layout.left + side * (colW + GUTTER)
    // From the bottom up: the want, then the rungs, lowest first.
    let y = bottom
    for (const line of [...col.want].reverse()) {
      layout.drawClean(line, x, y + 3, WANT, page)
      y += lh
    }
    for (const line of [...col.label].reverse()) {
      layout.drawClean(line, x, y + 2, LABEL, page)
      y += llh
    }
    page.drawLine({ start: { x, y: y + 1 }, end: { x: x + colW, y: y + 1 }, thickness: 1.5, color: pdfPalette.primary })
    y += 6
    for (const rung of col.rungs) {
      y += RUNG_GAP
      page.drawLine({ start: { x, y: y + BAR / 2 }, end: { x: x + colW, y: y + BAR / 2 }, thickness: BAR, color: pdfPalette.rung })
      y += BAR
      for (const line of [...rung].reverse()) {
        layout.drawClean(line, x + 3, y + 3, TEXT, page)
        y += lh
      }
    }
  })
  layout.y = top - blockH
}

function drawAsLists(layout: SummaryLayout, wants: readonly Want[], meetingPoint: string | undefined): void {
  wants.slice(0, 2).forEach((w, side) => {
    layout.paragraph(`${sideLabel(side, w)}: ${w.text || '-'}`, WANT)
    layout.paragraph('Ladder, lowest rung first:', LABEL)
    w.ladder.forEach((r, i) => layout.paragraph(`${i + 1}. ${r.text}`, TEXT, 12))
  })
  if (meetingPoint) layout.paragraph(`Meeting point: ${meetingPoint}`, WANT)
}
