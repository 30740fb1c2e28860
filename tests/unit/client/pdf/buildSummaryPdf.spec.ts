/// <reference types="node" />
import { PDFDocument } from 'pdf-lib'
import { describe, expect, it } from 'vitest'
import { buildSummaryPdf, summaryDateRange, type SummaryInput } from '@/pdf/buildSummaryPdf'
import { cautionFooter } from '@/pdf/summaryLayout'
import { loraBytes, moment, ninetyDays, phq9, poppler, tug } from './summaryFixtures'

const DAY = 86_400_000
const to = new Date('2026-05-20T18:00:00').getTime()
const fonts = loraBytes()
const squash = (s: string) => s.replace(/\s+/g, ' ')

function small(overrides: Partial<SummaryInput> = {}): SummaryInput {
  return {
    from: to - 14 * DAY,
    to,
    periodLabel: 'Since the last session',
    pageSize: 'A4',
    entries: [moment(to - 3 * DAY, 'Walked by the river at lunch', 35, ['body']), moment(to - 2 * DAY, 'Could not sleep', 70)],
    measures: [phq9(to - 10 * DAY, 14), phq9(to - DAY, 9)],
    bringUp: ['How to say no at work'],
    safetyPlan: null,
    generatedAt: to,
    ...overrides,
  }
}

describe('buildSummaryPdf', () => {
  it('puts "Page n of N", the date range and the caution footer on every page of a 90-day summary that paginates', async () => {
    const input = ninetyDays(to)
    const progress: number[] = []
    const bytes = await buildSummaryPdf(input, fonts, (f) => progress.push(f))
    const doc = await PDFDocument.load(bytes)
    const pages = doc.getPageCount()
    expect(pages).toBeGreaterThan(10)
    const range = summaryDateRange(input.from, input.to)
    const text = poppler('pdftotext', bytes, ['-layout'])
    const perPage = text.split('\f').filter((p) => p.trim())
    expect(perPage).toHaveLength(pages)
    perPage.forEach((p, i) => {
      expect(p).toContain(`Page ${i + 1} of ${pages}`)
      expect(p).toContain(range)
      expect(squash(p)).toContain(squash(cautionFooter))
    })
    // Nothing is lost at page breaks: the first and the last day's long moments are both there.
    const flat = squash(text)
    expect(flat).toContain('Day 1 morning.')
    expect(flat).toContain('Day 90 evening: quieter, a walk by the canal.')
    expect(flat).toContain('before I could drive home.')
    expect(progress[progress.length - 1]).toBe(1)
    expect(progress).toEqual([...progress].sort((a, b) => a - b))
  }, 60_000)

  it('embeds Lora as subset fonts and uses the Letter size when asked', async () => {
    const bytes = await buildSummaryPdf(small({ pageSize: 'Letter' }), fonts)
    const fontsOut = poppler('pdffonts', bytes)
    const rows = fontsOut.split('\n').filter((l) => /Lora/.test(l))
    expect(rows.length).toBeGreaterThanOrEqual(2)
    // pdffonts columns: name type encoding emb sub uni; a subset name is prefixed ABCDEF+.
    for (const r of rows) expect(r).toMatch(/^[A-Z]{6}\+Lora\S*\s.*\syes\s+yes\s+yes/)
    const page = (await PDFDocument.load(bytes)).getPage(0)
    expect([Math.round(page.getWidth()), Math.round(page.getHeight())]).toEqual([612, 792])
  })

  it('never fails on emoji, CJK, ≥, → and zero-width characters, and keeps é, ł and –', async () => {
    const entries = [
      moment(to - DAY, 'Felt 😀 then 😭 — distress ≥ 80 → I left. 日本語 zero\u200Bwidth', 82),
      moment(to - 2 * DAY, 'Café with Łucja – calmer', 30),
    ]
    const bytes = await buildSummaryPdf(small({ entries, bringUp: ['Ask about ≤ 3 sessions 👍'] }), fonts)
    const text = squash(poppler('pdftotext', bytes))
    expect(text).toContain('distress >= 80 -> I left.')
    expect(text).toContain('zerowidth')
    expect(text).toContain('Café with Łucja – calmer')
    expect(text).toContain('Ask about <= 3 sessions')
    expect(text).not.toMatch(/[😀😭👍]/u)
    // Łucja needs the latin-ext file, so it is embedded too.
    expect(poppler('pdffonts', bytes).split('\n').filter((l) => /Lora/.test(l)).length).toBeGreaterThanOrEqual(3)
  })

  it('shows the measure table with score, band and plain change, and marks scores the therapist entered', async () => {
    const bytes = await buildSummaryPdf(small({ measures: [phq9(to - 30 * DAY, 16, 'therapist'), phq9(to - 10 * DAY, 14), phq9(to - DAY, 9)] }), fonts)
    const text = squash(poppler('pdftotext', bytes, ['-layout']))
    expect(text).toContain('16 of 27')
    expect(text).toContain('moderately severe')
    expect(text).toContain('entered by your therapist')
    expect(text).toContain('7 points lower than your first')
  })

  it('draws both ladders and the meeting point of a tug, and the safety plan only when included', async () => {
    const t = tug(to - DAY, 'Staying late or going home', [['Rest in the evenings', 'Being a present parent'], ['Keeping this job']], 'Looking after my family')
    const without = squash(poppler('pdftotext', await buildSummaryPdf(small({ entries: [t] }), fonts)))
    for (const s of ['Rest in the evenings', 'Being a present parent', 'Keeping this job', 'Meeting point', 'Looking after my family', 'Go home on time', 'Be seen as reliable'])
      expect(without).toContain(s)
    expect(without).not.toContain('My safety plan')
    const withPlan = squash(poppler('pdftotext', await buildSummaryPdf(small({ entries: [t], safetyPlan: [{ title: 'Things I can do on my own', lines: ['Cold water on my face'] }] }), fonts)))
    expect(withPlan).toContain('My safety plan')
    expect(withPlan).toContain('Cold water on my face')
  })

  it('says so in words when there are fewer than two distress ratings', async () => {
    const text = squash(poppler('pdftotext', await buildSummaryPdf(small({ entries: [moment(to - DAY, 'Only one', 40)] }), fonts)))
    expect(text).toContain('Distress was rated once in this period, at 40.')
  })

  it('keeps a very long ladder readable by writing it as a list when it cannot fit on one page', async () => {
    const rungs = Array.from({ length: 60 }, (_, i) => `Rung number ${i + 1}, a longer reason that wraps onto a second line in the narrow column of a ladder`)
    const bytes = await buildSummaryPdf(small({ entries: [tug(to - DAY, 'A tall one', [rungs, ['Short']])] }), fonts)
    const text = squash(poppler('pdftotext', bytes))
    expect(text).toContain('Ladder, lowest rung first:')
    expect(text).toContain('60. Rung number 60')
  })
})
