/// <reference types="node" />
import { execFileSync } from 'node:child_process'
import fs from 'node:fs'
import os from 'node:os'
import path from 'node:path'
import fontkit from '@pdf-lib/fontkit'
import type { SummaryFontBytes, SummaryInput } from '@/pdf/buildSummaryPdf'
import type { GlyphCoverage } from '@/pdf/pdfGlyphs'
import type { Entry } from '@shared/schemas/entry.schema'
import type { MeasureResult } from '@shared/schemas/measure.schema'

const files = path.resolve('node_modules/@fontsource/lora/files')
const read = (name: string) => new Uint8Array(fs.readFileSync(path.join(files, name)))

/** The same Lora .woff files the browser fetches. */
export function loraBytes(): SummaryFontBytes {
  return {
    regular: { latin: read('lora-latin-400-normal.woff'), ext: read('lora-latin-ext-400-normal.woff') },
    bold: { latin: read('lora-latin-700-normal.woff'), ext: read('lora-latin-ext-700-normal.woff') },
  }
}

export function loraCoverage(): GlyphCoverage {
  const b = loraBytes()
  return { latin: new Set(fontkit.create(b.regular.latin).characterSet), ext: new Set(fontkit.create(b.regular.ext).characterSet) }
}

const DAY = 86_400_000
let n = 0
const id = () => `00000000-0000-4000-8000-${String(++n).padStart(12, '0')}`

export function moment(at: number, body: string, distress?: number, tags: string[] = []): Entry {
  return { id: id(), kind: 'moment', createdAt: at, updatedAt: at, version: 1, body, ...(distress !== undefined ? { distressBefore: distress } : {}), wants: [], backgroundThoughts: [], tags, shares: [] }
}

export function tug(at: number, body: string, ladders: [string[], string[]], meetingPoint?: string): Entry {
  return {
    id: id(),
    kind: 'tug',
    createdAt: at,
    updatedAt: at,
    version: 1,
    body,
    distressBefore: 70,
    distressAfter: 45,
    wants: [
      { text: 'Go home on time', importance: 7, ladder: ladders[0].map((text, i) => ({ id: `a${i}`, text })) },
      { text: 'Be seen as reliable', importance: 6, ladder: ladders[1].map((text, i) => ({ id: `b${i}`, text })) },
    ],
    ...(meetingPoint ? { meetingPoint } : {}),
    backgroundThoughts: [],
    tags: ['work'],
    shares: [],
  }
}

export function phq9(at: number, total: number, source: MeasureResult['source'] = 'person'): MeasureResult {
  const band = total >= 20 ? 'severe' : total >= 15 ? 'moderately severe' : total >= 10 ? 'moderate' : total >= 5 ? 'mild' : 'minimal'
  return { id: id(), instrument: 'phq9', takenAt: new Date(at).toISOString(), total, band, prorated: false, selfHarm: 'none', source }
}

/** A 90-day journal: 2 moments a day with long text, a tug every 3 days, 12 questionnaires. */
export function ninetyDays(to: number): SummaryInput {
  const from = to - 90 * DAY
  const entries: Entry[] = []
  const long = 'The meeting ran over again and I noticed my shoulders creeping up towards my ears while everyone talked past each other; afterwards I sat in the car for ten minutes before I could drive home.'
  for (let d = 0; d < 90; d++) {
    const t = from + d * DAY + 9 * 3_600_000
    entries.push(moment(t, `Day ${d + 1} morning. ${long}`, (d * 17) % 100, ['work']))
    entries.push(moment(t + 8 * 3_600_000, `Day ${d + 1} evening: quieter, a walk by the canal.`, (d * 31) % 100, ['body']))
    if (d % 3 === 0) entries.push(tug(t + 3_600_000, `Tug on day ${d + 1}: staying late or going home`, [['Rest in the evenings', 'Having energy for my kids', 'Being a present parent'], ['Keeping this job', 'Security for my family']], d % 6 === 0 ? 'Looking after my family' : undefined))
  }
  const measures = Array.from({ length: 12 }, (_, i) => phq9(from + (i * 7 + 1) * DAY, 18 - i))
  return { from, to, periodLabel: 'Last 90 days', pageSize: 'A4', entries, measures, bringUp: ['Sleep has been worse', 'The conversation with my manager'], safetyPlan: null, generatedAt: to }
}

/** Writes the PDF to a temp file and runs a poppler tool on it (installed in CI by .ci/run). */
export function poppler(tool: 'pdftotext' | 'pdffonts' | 'pdfinfo', bytes: Uint8Array, args: string[] = []): string {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'rungsPdf-'))
  const file = path.join(dir, 'summary.pdf')
  fs.writeFileSync(file, bytes)
  try {
    return execFileSync(tool, tool === 'pdftotext' ? [...args, file, '-'] : [...args, file], { encoding: 'utf8' })
  } finally {
    fs.rmSync(dir, { recursive: true, force: true })
  }
}
