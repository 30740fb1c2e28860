import { parse } from 'csv-parse/sync'
import { describe, expect, it } from 'vitest'
import { csvCell, csvDocument, csvRow } from '../../../shared/csv/csvCell'

describe('csvCell', () => {
  it('leaves plain text and numbers as they are', () => {
    expect(csvCell('PHQ-9')).toBe('PHQ-9')
    expect(csvCell(12)).toBe('12')
    expect(csvCell(0)).toBe('0')
    expect(csvCell('')).toBe('')
  })

  it('writes null and undefined as an empty cell', () => {
    expect(csvCell(null)).toBe('')
    expect(csvCell(undefined)).toBe('')
  })

  it('puts an apostrophe before every cell that a spreadsheet could run as a formula', () => {
    // OWASP CSV Injection: = + - @ tab and carriage return at the start of a cell
    expect(csvCell('=1+1')).toBe("'=1+1")
    expect(csvCell('+1')).toBe("'+1")
    expect(csvCell('-2')).toBe("'-2")
    expect(csvCell(-2)).toBe("'-2")
    expect(csvCell('@x')).toBe("'@x")
    expect(csvCell('\tcmd')).toBe("'\tcmd")
    expect(csvCell('=cmd|\' /C calc\'!A0')).toBe("'=cmd|' /C calc'!A0")
  })

  it('quotes a formula that also holds quotes and commas, doubling the quotes', () => {
    expect(csvCell('=HYPERLINK("http://example.invalid/?x=1","click")')).toBe(`"'=HYPERLINK(""http://example.invalid/?x=1"",""click"")"`)
  })

  it('quotes a leading carriage return after escaping it', () => {
    expect(csvCell('\r=1')).toBe(`"'\r=1"`)
  })

  it('quotes commas, quotes and line breaks per RFC 4180', () => {
    expect(csvCell('a,b')).toBe('"a,b"')
    expect(csvCell('say "hi"')).toBe('"say ""hi"""')
    expect(csvCell('two\nlines')).toBe('"two\nlines"')
  })

  it('does not escape a dangerous character that is not at the start', () => {
    expect(csvCell('a=b')).toBe('a=b')
    expect(csvCell('2026-09-14')).toBe('2026-09-14')
  })
})

describe('csvDocument', () => {
  it('reads back through a CSV parser as the same cells, with the apostrophes kept', () => {
    const rows = [
      ['date', 'measure', 'note'],
      ['2026-09-14', 'PHQ-9', '=HYPERLINK("http://example.invalid","x")'],
      ['2026-09-15', 'GAD-7', 'line one\r\nline two, "quoted"'],
    ]
    const text = csvDocument(rows)
    expect(text.endsWith('\r\n')).toBe(true)
    const back = parse(text) as string[][]
    expect(back).toEqual([rows[0], ['2026-09-14', 'PHQ-9', `'=HYPERLINK("http://example.invalid","x")`], rows[2]])
  })

  it('joins cells with commas', () => {
    expect(csvRow(['a', 1, null, '+x'])).toBe("a,1,,'+x")
  })
})
