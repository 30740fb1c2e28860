/** Which of the two Lora files draws a character: @fontsource splits Lora into a latin and a latin-ext file. */
export type FontSlot = 'latin' | 'ext'

/** The code points each embedded file can draw. */
export interface GlyphCoverage {
  latin: ReadonlySet<number>
  ext: ReadonlySet<number>
}

export interface TextRun {
  slot: FontSlot
  text: string
}

// Written out in ASCII when Lora cannot draw them, so the meaning survives.
const substitutes: Record<string, string> = {
  '≥': '>=',
  '≤': '<=',
  '≠': '!=',
  '≈': '~',
  '→': '->',
  '←': '<-',
  '↔': '<->',
  '⇒': '=>',
  '⇐': '<=',
  '…': '...',
  '•': '-',
  '·': '-',
  '–': '-',
  '—': '-',
  '‘': "'",
  '’': "'",
  '“': '"',
  '”': '"',
  '×': 'x',
  '÷': '/',
  '½': '1/2',
  '✓': 'v',
  '✔': 'v',
}

// Invisible characters: zero-width space/joiners, word joiner, BOM, soft hyphen, variation selectors, emoji tags.
const invisible = /[\u200B-\u200F\u2060-\u2064\uFEFF\u00AD\uFE00-\uFE0F\u{E0000}-\u{E007F}\u{E0100}-\u{E01EF}]/u
// Emoji and their parts (skin tones, keycaps, flags) are left out rather than drawn as boxes.
const pictographic = /[\p{Extended_Pictographic}\u{1F3FB}-\u{1F3FF}\u{1F1E6}-\u{1F1FF}\u20E3]/u
const spaceLike = /[\t\u00A0\u1680\u2000-\u200A\u202F\u205F\u3000]/
const control = /[\u0000-\u001F\u007F-\u009F\u2028\u2029]/

function slotOf(cp: number, coverage: GlyphCoverage): FontSlot | null {
  if (coverage.latin.has(cp)) return 'latin'
  if (coverage.ext.has(cp)) return 'ext'
  return null
}

/**
 * The text with every character Lora cannot draw replaced: invisible ones and emoji dropped, ≥ → '>=' and the like
 * written out, anything else '?'. Never throws, whatever the input. Line breaks are the layout's business: pass one line.
 */
export function cleanText(text: string, coverage: GlyphCoverage): string {
  let out = ''
  for (const ch of text.normalize('NFC')) {
    const cp = ch.codePointAt(0)!
    if (slotOf(cp, coverage)) out += ch
    else if (invisible.test(ch)) continue
    else if (spaceLike.test(ch) || control.test(ch)) out += ' '
    else if (substitutes[ch] !== undefined) out += [...substitutes[ch]].filter((c) => slotOf(c.codePointAt(0)!, coverage)).join('')
    else if (pictographic.test(ch)) continue
    else out += slotOf(0x3f, coverage) ? '?' : ''
  }
  return out
}

/** Splits cleaned text into runs per font file, so latin-ext letters (ł, ő, ș …) come from the file that has them. */
export function textRuns(clean: string, coverage: GlyphCoverage): TextRun[] {
  const runs: TextRun[] = []
  for (const ch of clean) {
    const slot = slotOf(ch.codePointAt(0)!, coverage) ?? 'latin'
    const last = runs[runs.length - 1]
    if (last && last.slot === slot) last.text += ch
    else runs.push({ slot, text: ch })
  }
  return runs
}

/** True when any of the texts needs the latin-ext file (so it is embedded only then). */
export function needsExt(texts: Iterable<string>, coverage: GlyphCoverage): boolean {
  for (const t of texts) {
    for (const ch of t.normalize('NFC')) {
      const cp = ch.codePointAt(0)!
      if (!coverage.latin.has(cp) && coverage.ext.has(cp)) return true
    }
  }
  return false
}
