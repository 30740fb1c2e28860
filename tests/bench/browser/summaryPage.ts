// The app's own summary path, bundled as the app bundles it: read 90 days from Dexie, then build the PDF with Lora.
import { db } from '@/db/db'
import { createEntry, entriesBetween } from '@/db/entriesRepository'
import { listMeasureEntries } from '@/db/measuresRepository'
import { makeSummaryPdf } from '@/pdf/makeSummaryPdf'
import type { MeasureResult } from '@shared/schemas/measure.schema'
import { measureResultOfEntry } from '@shared/scoring/measureResults'
import { spread, type SummaryBenchResults } from '../benchResults'
import { makeGenerator, seededRandom } from './benchEntries'

declare global {
  interface Window {
    runSummaryBench(): Promise<SummaryBenchResults>
  }
}

const DAY = 24 * 60 * 60 * 1000
const DAYS = 90
const RUNS = 5

async function seed(end: number): Promise<void> {
  const gen = makeGenerator(7)
  const rand = seededRandom(8)
  const from = end - DAYS * DAY
  for (let d = 0; d < DAYS; d++) {
    const day = from + d * DAY
    await createEntry(gen.moment(day + 9 * 3_600_000), end)
    await createEntry(gen.moment(day + 19 * 3_600_000), end)
    if (d % 3 === 0) await createEntry(gen.tug(day + 13 * 3_600_000), end)
  }
  // Twelve questionnaires, PHQ-9 and GAD-7 by turns, about one a week.
  for (let i = 0; i < 12; i++) {
    const at = from + (i * 7 + 2) * DAY
    const instrument = i % 2 === 0 ? 'phq9' : 'gad7'
    const answers = Array.from({ length: instrument === 'phq9' ? 9 : 7 }, () => Math.floor(rand() * 4) as 0 | 1 | 2 | 3)
    await createEntry({ kind: 'measure', createdAt: at, body: '', wants: [], backgroundThoughts: [], tags: [], measure: { instrument, answers, completedAt: at } }, end)
  }
}

async function gather(from: number, to: number) {
  const [inRange, measureEntries] = await Promise.all([entriesBetween(from, to), listMeasureEntries()])
  return {
    entries: inRange.filter((e) => e.kind === 'moment' || e.kind === 'tug'),
    measures: measureEntries.map(measureResultOfEntry).filter((r): r is MeasureResult => r !== null && Date.parse(r.takenAt) >= from),
  }
}

async function runSummaryBench(): Promise<SummaryBenchResults> {
  await db.open()
  await db.entries.clear()
  const end = Date.now()
  await seed(end)
  const from = end - DAYS * DAY
  const gatherMs: number[] = []
  const totalMs: number[] = []
  let bytes = new Uint8Array()
  let counts = { entries: 0, measures: 0 }
  // One untimed build first, so the figures are for a warm page (fonts fetched, code compiled), as on a second try.
  for (let run = 0; run <= RUNS; run++) {
    const start = performance.now()
    const { entries, measures } = await gather(from, end)
    const gathered = performance.now()
    bytes = await makeSummaryPdf({ from, to: end, periodLabel: 'Last 90 days', pageSize: 'A4', entries, measures, bringUp: ['Sleep', 'Work'], safetyPlan: null, generatedAt: end })
    if (run === 0) continue
    gatherMs.push(gathered - start)
    totalMs.push(performance.now() - start)
    counts = { entries: entries.length, measures: measures.length }
  }
  const { PDFDocument } = await import('pdf-lib')
  const pages = (await PDFDocument.load(bytes)).getPageCount()
  return { runs: RUNS, days: DAYS, ...counts, gather: spread(gatherMs), total: spread(totalMs), bytes: bytes.length, pages }
}

window.runSummaryBench = runSummaryBench
