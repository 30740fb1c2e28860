import { PageSizes, rgb, type PDFDocument, type PDFFont, type PDFPage, type RGB } from 'pdf-lib'
import { cleanText, textRuns, type GlyphCoverage } from './pdfGlyphs'

export type PageSize = 'A4' | 'Letter'

/** Print colours: the light values of client/css/brand.css (paper prints light whatever the screen's mode). */
export const pdfPalette = {
  ink: rgb(0x2e / 255, 0x34 / 255, 0x40 / 255),
  inkSoft: rgb(0x4c / 255, 0x55 / 255, 0x66 / 255),
  line: rgb(0xdd / 255, 0xd4 / 255, 0xc4 / 255),
  rung: rgb(0xa8 / 255, 0x6e / 255, 0x1a / 255),
  primary: rgb(0x3d / 255, 0x4a / 255, 0x7a / 255),
  paperDeep: rgb(0xf1 / 255, 0xeb / 255, 0xe0 / 255),
}

/** Said at the foot of every page. */
export const cautionFooter = 'Rungs is a personal journal, not a clinical record or a crisis service. If you are in danger, call your local emergency number.'

export interface FontFiles {
  latin: PDFFont
  ext: PDFFont | null
}
export interface SummaryFonts {
  regular: FontFiles
  bold: FontFiles
  coverage: GlyphCoverage
}

export interface TextStyle {
  size?: number
  bold?: boolean
  color?: RGB
  /** Space between baselines, as a multiple of the size. */
  leading?: number
}

const MARGIN_X = 48
const HEADER_H = 44
const FOOTER_H = 52

/**
 * A cursor that writes down the page and starts a new one when the next block would not fit. Header and footer are
 * drawn at the end, when the page count is known ("Page n of N").
 */
export class SummaryLayout {
  readonly width: number
  readonly height: number
  readonly left = MARGIN_X
  readonly right: number
  readonly top: number
  readonly bottom = FOOTER_H + 14
  page!: PDFPage
  y = 0

  constructor(
    readonly doc: PDFDocument,
    readonly fonts: SummaryFonts,
    size: PageSize,
  ) {
    const [w, h] = size === 'A4' ? PageSizes.A4 : PageSizes.Letter
    this.width = w
    this.height = h
    this.right = w - MARGIN_X
    this.top = h - HEADER_H - 10
    this.addPage()
  }

  get contentWidth(): number {
    return this.right - this.left
  }

  /** Height a page offers below the header and above the footer. */
  get pageRoom(): number {
    return this.top - this.bottom
  }

  addPage(): void {
    this.page = this.doc.addPage([this.width, this.height])
    this.y = this.top
  }

  /** Starts a new page unless `h` points still fit on this one. */
  ensure(h: number): void {
    if (this.y - h < this.bottom && this.y < this.top) this.addPage()
  }

  gap(h: number): void {
    this.y -= h
  }

  clean(text: string): string {
    return cleanText(text, this.fonts.coverage)
  }

  private widths = new Map<string, number>()

  /** Width of cleaned text; cached, since wrapping asks for the same words again and again. */
  widthOf(clean: string, size: number, bold = false): number {
    const key = `${bold ? 'b' : 'r'}${clean}`
    let unit = this.widths.get(key)
    if (unit === undefined) {
      const files = bold ? this.fonts.bold : this.fonts.regular
      unit = 0
      for (const run of textRuns(clean, this.fonts.coverage)) unit += (run.slot === 'ext' && files.ext ? files.ext : files.latin).widthOfTextAtSize(run.text, 1000)
      this.widths.set(key, unit)
    }
    return (unit * size) / 1000
  }

  /** Draws one already-cleaned line with its baseline at y. */
  drawClean(clean: string, x: number, y: number, style: TextStyle = {}, page = this.page): void {
    const size = style.size ?? 10
    const files = style.bold ? this.fonts.bold : this.fonts.regular
    for (const run of textRuns(clean, this.fonts.coverage)) {
      const font = run.slot === 'ext' && files.ext ? files.ext : files.latin
      page.drawText(run.text, { x, y, size, font, color: style.color ?? pdfPalette.ink })
      x += font.widthOfTextAtSize(run.text, size)
    }
  }

  /** Text broken into lines no wider than `width`; paragraphs (line breaks) kept; over-long words split. */
  wrap(text: string, width: number, style: TextStyle = {}): string[] {
    const size = style.size ?? 10
    const lines: string[] = []
    for (const para of text.replace(/\r\n?/g, '\n').split('\n')) {
      const words = this.clean(para).split(' ').filter((w) => w.length > 0)
      const space = this.widthOf(' ', size, style.bold)
      let line = ''
      let lineW = 0
      for (let word of words) {
        const w = this.widthOf(word, size, style.bold)
        if (line && lineW + space + w <= width) {
          line = `${line} ${word}`
          lineW += space + w
          continue
        }
        if (!line && w <= width) {
          line = word
          lineW = w
          continue
        }
        if (line) lines.push(line)
        while (this.widthOf(word, size, style.bold) > width) {
          const chars = [...word]
          let n = chars.length - 1
          while (n > 1 && this.widthOf(chars.slice(0, n).join(''), size, style.bold) > width) n--
          lines.push(chars.slice(0, n).join(''))
          word = chars.slice(n).join('')
        }
        line = word
        lineW = this.widthOf(word, size, style.bold)
      }
      lines.push(line)
    }
    return lines
  }

  lineHeight(style: TextStyle = {}): number {
    return (style.size ?? 10) * (style.leading ?? 1.35)
  }

  /** Wrapped text down the page at `indent`, breaking pages between lines. */
  paragraph(text: string, style: TextStyle = {}, indent = 0): void {
    const lh = this.lineHeight(style)
    for (const line of this.wrap(text, this.contentWidth - indent, style)) {
      this.ensure(lh)
      this.y -= lh
      this.drawClean(line, this.left + indent, this.y + lh * 0.25, style)
    }
  }

  /** A section heading, kept with at least `keep` points of what follows. */
  heading(text: string, keep = 60): void {
    const style = { size: 14, bold: true, color: pdfPalette.primary }
    this.ensure(this.lineHeight(style) + keep + 10)
    this.gap(10)
    this.paragraph(text, style)
    this.page.drawLine({ start: { x: this.left, y: this.y - 2 }, end: { x: this.right, y: this.y - 2 }, thickness: 0.75, color: pdfPalette.line })
    this.gap(8)
  }

  rule(): void {
    this.page.drawLine({ start: { x: this.left, y: this.y }, end: { x: this.right, y: this.y }, thickness: 0.5, color: pdfPalette.line })
  }

  /** "Page n of N", the date range and the caution footer on every page. */
  finish(title: string, dateRange: string): void {
    const pages = this.doc.getPages()
    const small = { size: 8.5, color: pdfPalette.inkSoft }
    pages.forEach((page, i) => {
      const topY = this.height - 30
      this.drawClean(this.clean(`${title} · ${dateRange}`), this.left, topY, small, page)
      const pageText = this.clean(`Page ${i + 1} of ${pages.length}`)
      this.drawClean(pageText, this.right - this.widthOf(pageText, small.size), topY, small, page)
      page.drawLine({ start: { x: this.left, y: topY - 8 }, end: { x: this.right, y: topY - 8 }, thickness: 0.5, color: pdfPalette.line })
      const footLines = this.wrap(cautionFooter, this.contentWidth, { size: 8 })
      let fy = FOOTER_H - 10
      page.drawLine({ start: { x: this.left, y: fy + 12 }, end: { x: this.right, y: fy + 12 }, thickness: 0.5, color: pdfPalette.line })
      for (const line of footLines) {
        this.drawClean(line, this.left, fy, { size: 8, color: pdfPalette.inkSoft }, page)
        fy -= 10.5
      }
    })
  }
}
