import type { InstrumentId } from '@shared/content/measureForms'
import fontkit from '@pdf-lib/fontkit'
import { format } from 'date-fns'
import { PDFDocument } from 'pdf-lib'
import { distressSeries } from '@shared/patterns/distressSeries'
import type { Entry } from '@shared/schemas/entry.schema'
import type { MeasureResult } from '@shared/schemas/measure.schema'
import { drawDistressChart } from './distressChart'
import { drawMeasureTable } from './measureTable'
import { needsExt, type GlyphCoverage } from './pdfGlyphs'
import { pdfPalette, SummaryLayout, type FontFiles, type PageSize, type SummaryFonts } from './summaryLayout'
import { planTugLadders } from './tugLadderBlock'

/** The Lora .woff files (latin and latin-ext, 400 and 700). Woff, not woff2: woff2 with subsetting hangs in fontkit. */
export interface SummaryFontBytes {
  regular: { latin: Uint8Array; ext: Uint8Array }
  bold: { latin: Uint8Array; ext: Uint8Array }
}

/** Everything the PDF shows, already chosen by the person. */
export interface SummaryInput {
  /** Inclusive epoch-ms bounds of the period. */
  from: number
  to: number
  /** How the period was chosen, e.g. "Since the last session". */
  periodLabel: string
  pageSize: PageSize
  /** The moments and tugs the person ticked. */
  entries: Entry[]
  measures: MeasureResult[]
  /** The first score ever of each measure (it may fall before the period, e.g. an intake score), so change counts from it. */
  firstScores?: Partial<Record<InstrumentId, MeasureResult>>
  /** "Things I want to bring up", in the person's order. */
  bringUp: string[]
  /** Null when the person left the safety plan out. */
  safetyPlan: SafetyPlanSection[] | null
  generatedAt: number
}

/** One titled part of the safety plan as the PDF prints it (from shared/content/safetyPlanSections.ts). */
export interface SafetyPlanSection {
  title: string
  lines: string[]
}

export type SummaryProgress = (fraction: number, label: string) => void

export const summaryTitle = 'Summary for my appointment'

const tick = () => new Promise<void>((resolve) => setTimeout(resolve, 0))
const day = (t: number) => format(t, 'd MMM yyyy')
const when = (t: number) => format(t, 'EEE d MMM yyyy, HH:mm')

/** "3 May 2026 – 16 May 2026": on the first page and in every page's header. */
export function summaryDateRange(from: number, to: number): string {
  return `${day(from)} – ${day(to)}`
}

function coverageOf(bytes: SummaryFontBytes): GlyphCoverage {
  // Only what both weights can draw, so bold and regular text are cleaned alike.
  const both = (a: Uint8Array, b: Uint8Array) => {
    const bold = new Set(fontkit.create(b).characterSet)
    return new Set(fontkit.create(a).characterSet.filter((cp) => bold.has(cp)))
  }
  return { latin: both(bytes.regular.latin, bytes.bold.latin), ext: both(bytes.regular.ext, bytes.bold.ext) }
}

function textsOf(input: SummaryInput): string[] {
  return [
    input.periodLabel,
    ...input.bringUp,
    ...input.entries.flatMap((e) => [e.body, e.meetingPoint ?? '', ...e.tags, ...e.backgroundThoughts, ...e.wants.flatMap((w) => [w.text, ...w.ladder.map((r) => r.text)])]),
    ...(input.safetyPlan ?? []).flatMap((s) => [s.title, ...s.lines]),
  ]
}

function entryHeading(e: Entry): string {
  const parts = [when(e.createdAt)]
  if (e.kind === 'tug') {
    if (e.distressBefore !== undefined && e.distressAfter !== undefined) parts.push(`distress ${e.distressBefore} before, ${e.distressAfter} after`)
    else if (e.distressBefore !== undefined) parts.push(`distress ${e.distressBefore} before`)
  } else if (e.distressBefore !== undefined) parts.push(`distress ${e.distressBefore}`)
  return parts.join(' · ')
}

function drawEntryExtras(layout: SummaryLayout, e: Entry): void {
  for (const t of e.backgroundThoughts.filter((s) => s.trim())) layout.paragraph(`Noticed: ${t}`, { size: 9.5, color: pdfPalette.inkSoft }, 10)
  if (e.tags.length) layout.paragraph(`Tags: ${e.tags.join(', ')}`, { size: 8.5, color: pdfPalette.inkSoft })
}

function drawMoment(layout: SummaryLayout, e: Entry): void {
  layout.ensure(layout.lineHeight({ size: 9 }) + layout.lineHeight() * 2 + 6)
  layout.gap(6)
  layout.paragraph(entryHeading(e), { size: 9, bold: true, color: pdfPalette.inkSoft })
  if (e.body.trim()) layout.paragraph(e.body)
  drawEntryExtras(layout, e)
  layout.gap(4)
  layout.rule()
}

function drawTug(layout: SummaryLayout, e: Entry): void {
  const ladders = planTugLadders(layout, e.wants, e.meetingPoint)
  const headH = layout.lineHeight({ size: 9 }) + layout.wrap(e.body, layout.contentWidth, { size: 10.5 }).length * layout.lineHeight({ size: 10.5 }) + 16
  // Keep the heading with its ladders when both fit on one page.
  layout.ensure(headH + ladders.height <= layout.pageRoom ? headH + ladders.height : headH + 40)
  layout.gap(8)
  layout.paragraph(entryHeading(e), { size: 9, bold: true, color: pdfPalette.inkSoft })
  if (e.body.trim()) layout.paragraph(e.body, { size: 10.5 })
  layout.gap(8)
  ladders.draw()
  layout.gap(4)
  drawEntryExtras(layout, e)
  layout.gap(6)
  layout.rule()
}

/**
 * Builds the appointment summary on the device with Lora embedded (subset), A4 or Letter. Characters Lora lacks are
 * replaced, never fatal. Every page carries "Page n of N", the date range and a caution footer.
 */
export async function buildSummaryPdf(input: SummaryInput, fontBytes: SummaryFontBytes, onProgress: SummaryProgress = () => {}): Promise<Uint8Array> {
  onProgress(0.1, 'Preparing the fonts')
  await tick()
  const coverage = coverageOf(fontBytes)
  const doc = await PDFDocument.create()
  doc.registerFontkit(fontkit)
  const withExt = needsExt(textsOf(input), coverage)
  // A subset font's name starts with a six-letter tag and '+', one tag per subset (ISO 32000-1, 9.6.4).
  const embed = async (files: { latin: Uint8Array; ext: Uint8Array }, weight: 'Regular' | 'Bold', tags: [string, string]): Promise<FontFiles> => ({
    latin: await doc.embedFont(files.latin, { subset: true, customName: `${tags[0]}+Lora-${weight}` }),
    ext: withExt ? await doc.embedFont(files.ext, { subset: true, customName: `${tags[1]}+Lora-${weight}-Ext` }) : null,
  })
  const fonts: SummaryFonts = {
    regular: await embed(fontBytes.regular, 'Regular', ['RUNGSA', 'RUNGSB']),
    bold: await embed(fontBytes.bold, 'Bold', ['RUNGSC', 'RUNGSD']),
    coverage,
  }
  const dateRange = summaryDateRange(input.from, input.to)
  doc.setTitle(`${summaryTitle}, ${dateRange}`)
  doc.setCreator('Rungs')
  doc.setProducer('Rungs (pdf-lib)')
  doc.setCreationDate(new Date(input.generatedAt))
  doc.setLanguage('en')

  const layout = new SummaryLayout(doc, fonts, input.pageSize)
  const entries = [...input.entries].sort((a, b) => a.createdAt - b.createdAt)
  const tugs = entries.filter((e) => e.kind === 'tug')
  const moments = entries.filter((e) => e.kind === 'moment')

  layout.paragraph(summaryTitle, { size: 20, bold: true, color: pdfPalette.primary })
  layout.gap(2)
  layout.paragraph(`${dateRange} (${input.periodLabel.toLowerCase()})`, { size: 11 })
  const count = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`
  layout.paragraph(
    `Made on this device on ${when(input.generatedAt)}: ${count(moments.length, 'moment', 'moments')}, ${count(tugs.length, 'tug', 'tugs')}, ${count(input.measures.length, 'questionnaire', 'questionnaires')}.`,
    { size: 9, color: pdfPalette.inkSoft },
  )

  if (input.bringUp.some((s) => s.trim())) {
    layout.heading('Things I want to bring up')
    input.bringUp
      .filter((s) => s.trim())
      .forEach((item, i) => layout.paragraph(`${i + 1}. ${item}`, { size: 10.5 }, 4))
  }

  onProgress(0.25, 'Drawing the distress chart')
  await tick()
  layout.heading('Distress over the period', 190)
  drawDistressChart(layout, distressSeries(entries).points, input.from, input.to)

  onProgress(0.35, 'Writing the questionnaires')
  await tick()
  layout.heading('Questionnaires')
  drawMeasureTable(layout, input.measures, input.firstScores)

  if (tugs.length) {
    layout.heading('Tugs', 120)
    layout.paragraph('Each want at the bottom of its ladder, the lowest rung just above it; a meeting point, if found, across both.', { size: 8.5, color: pdfPalette.inkSoft })
    for (const [i, e] of tugs.entries()) {
      drawTug(layout, e)
      if (i % 10 === 9) {
        onProgress(0.35 + (0.3 * (i + 1)) / tugs.length, 'Writing the tugs')
        await tick()
      }
    }
  }

  if (moments.length) {
    onProgress(0.65, 'Writing the moments')
    await tick()
    layout.heading('Moments')
    for (const [i, e] of moments.entries()) {
      drawMoment(layout, e)
      if (i % 25 === 24) {
        onProgress(0.65 + (0.2 * (i + 1)) / moments.length, 'Writing the moments')
        await tick()
      }
    }
  }

  if (input.safetyPlan) {
    layout.heading('My safety plan')
    layout.paragraph('A safety plan is best made and reviewed with your therapist.', { size: 8.5, color: pdfPalette.inkSoft })
    if (!input.safetyPlan.length) layout.paragraph('The plan has nothing written in it yet.')
    for (const s of input.safetyPlan) {
      layout.ensure(layout.lineHeight() * 3)
      layout.gap(4)
      layout.paragraph(s.title, { size: 10.5, bold: true })
      for (const line of s.lines) layout.paragraph(`- ${line}`, {}, 8)
    }
  }

  onProgress(0.88, 'Adding page numbers')
  await tick()
  layout.finish('Rungs summary', dateRange)
  onProgress(0.92, 'Saving the PDF')
  await tick()
  const bytes = await doc.save()
  onProgress(1, 'Done')
  return bytes
}
