// Count series, first layer: the cells of one line — numbers in the organization's decimal mark,
// channel names, header names, the delimiter and line ending, and which column holds what.
// The column layout itself is described in count-series.ts.
import type { ComputeIssue } from './errors'
import { errorIssue, warningIssue } from './errors'
import { readTypedNumber } from '../number-reader'
import type { NumberReading } from '../number-reader'

export type Channel = 'ambient' | 'mask'
export type SeriesLayout = 'long' | 'wide'

export const ISO_TIME = /^\d{4}-\d{2}-\d{2}[T ]\d{2}:\d{2}(?::\d{2}(?:\.\d+)?)?(?:Z|[+-]\d{2}:?\d{2})?$/i

export const TIME_NAMES = new Set(['t', 'time', 'seconds', 'second', 's', 'timestamp', 'elapsed'])
export const CHANNEL_NAMES = new Set(['channel', 'ch', 'line'])
export const CONC_NAMES = new Set(['conc', 'concentration', 'value', 'particles'])
export const AMBIENT_NAMES = new Set(['ambient', 'amb', 'a'])
export const MASK_NAMES = new Set(['mask', 'in-mask', 'inmask', 'in mask', 'm'])

const POWERS_OF_TEN = [1, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15]

// A concentration or time as a person writes it, read by the one number reader with the
// organization's decimal mark (DOMAIN.md "Typing numbers"); never guessed from the delimiter.
// Fast path for what a counter writes — an optional sign, up to 15 digits and at most one decimal
// mark — where digits / 10^k is exact-then-rounded once, so it equals Number(text) (both are
// correctly rounded) and what the reader returns. Anything else (grouped thousands, exponents,
// refusals) goes to the reader, whose message says what it read and how to write it.
export function parseNumber(cell: string, decimalCode: number): NumberReading | number {
  const length = cell.length
  const c0 = cell.charCodeAt(0)
  let i = c0 === 43 || c0 === 45 ? 1 : 0
  let mantissa = 0
  let digits = 0
  let fraction = -1
  for (; i < length; i++) {
    const c = cell.charCodeAt(i)
    if (c >= 48 && c <= 57) {
      mantissa = mantissa * 10 + (c - 48)
      digits++
      if (fraction >= 0) fraction++
    } else if (c === decimalCode && fraction < 0) {
      fraction = 0
    } else {
      break
    }
  }
  if (i === length && digits > 0 && digits <= 15) {
    const value = fraction > 0 ? mantissa / POWERS_OF_TEN[fraction]! : mantissa
    return c0 === 45 && value !== 0 ? -value : value
  }
  return readTypedNumber(cell, { decimalMark: decimalCode === 44 ? 'comma' : 'point' })
}

export function numberOrNull(cell: string, decimalCode: number): number | null {
  const read = parseNumber(cell, decimalCode)
  if (typeof read === 'number') return read
  return read.ok ? read.value : null
}

export function parseChannel(cell: string): Channel | null {
  if (cell === 'mask') return 'mask'
  if (cell === 'ambient') return 'ambient'
  const c = cell.toLowerCase()
  if (AMBIENT_NAMES.has(c)) return 'ambient'
  if (MASK_NAMES.has(c)) return 'mask'
  return null
}

export function headerName(cell: string): string {
  return cell.trim().toLowerCase().replace(/\s*[([].*$/, '').trim()
}

export function isTimeCell(cell: string, decimalCode: number): boolean {
  return numberOrNull(cell, decimalCode) !== null || ISO_TIME.test(cell)
}

const DELIMITERS = ['\t', ';', ','] as const

// The delimiter that splits each of the first lines into the same number of cells (tab first,
// then semicolon, then comma, so "0;12,5" reads as semicolon-separated with a decimal comma).
// Quoted text is skipped. Falls back to the delimiter seen most, then to a comma.
export function detectDelimiter(text: string): string {
  const counts: number[][] = [[], [], []]
  let lines = 0
  let inQuotes = false
  const perLine = [0, 0, 0]
  let lineHasText = false
  for (let i = 0; i < text.length && lines < 6; i++) {
    const ch = text.charCodeAt(i)
    if (ch === 34) inQuotes = !inQuotes
    if (inQuotes) continue
    if (ch === 10 || ch === 13) {
      if (lineHasText) {
        for (let d = 0; d < 3; d++) counts[d]!.push(perLine[d]!)
        lines++
      }
      perLine[0] = perLine[1] = perLine[2] = 0
      lineHasText = false
      continue
    }
    if (ch === 9) perLine[0]!++
    else if (ch === 59) perLine[1]!++
    else if (ch === 44) perLine[2]!++
    else if (ch > 32) lineHasText = true
  }
  if (lineHasText) for (let d = 0; d < 3; d++) counts[d]!.push(perLine[d]!)
  let best = -1
  let bestTotal = 0
  for (let d = 0; d < 3; d++) {
    const c = counts[d]!
    if (c.length && c[0]! > 0 && c.every(n => n === c[0])) return DELIMITERS[d]!
    const total = c.reduce((a, b) => a + b, 0)
    if (total > bestTotal) {
      best = d
      bestTotal = total
    }
  }
  return best >= 0 ? DELIMITERS[best]! : ','
}

export function detectNewline(text: string): '\n' | '\r\n' | '\r' {
  const n = text.indexOf('\n')
  if (n > 0 && text.charCodeAt(n - 1) === 13) return '\r\n'
  if (n < 0 && text.indexOf('\r') >= 0) return '\r'
  return '\n'
}

export interface Columns {
  layout: SeriesLayout
  time: number
  channel: number
  conc: number
  ambient: number
  mask: number
}

export function columnsFromHeader(row: string[], rowNumber: number, forced: SeriesLayout | undefined, issues: ComputeIssue[]): Columns | null {
  const cols: Columns = { layout: 'long', time: -1, channel: -1, conc: -1, ambient: -1, mask: -1 }
  const unknown: string[] = []
  row.forEach((cell, i) => {
    const name = headerName(cell)
    if (name === '') return
    if (TIME_NAMES.has(name) && cols.time < 0) cols.time = i
    else if (CHANNEL_NAMES.has(name) && cols.channel < 0) cols.channel = i
    else if (CONC_NAMES.has(name) && cols.conc < 0) cols.conc = i
    else if (AMBIENT_NAMES.has(name) && cols.ambient < 0) cols.ambient = i
    else if (MASK_NAMES.has(name) && cols.mask < 0) cols.mask = i
    else unknown.push(cell.trim())
  })
  const long = cols.channel >= 0 && cols.conc >= 0
  const wide = cols.ambient >= 0 || cols.mask >= 0
  cols.layout = forced ?? (long ? 'long' : 'wide')
  const fits = cols.time >= 0 && (cols.layout === 'long' ? long : wide)
  if (!fits) {
    issues.push(errorIssue(
      'unknown-layout',
      `Row ${rowNumber}: the header should name the columns t, channel, conc (or t, ambient, mask)`,
      { row: rowNumber, column: 1 }
    ))
    return null
  }
  if (unknown.length) {
    issues.push(warningIssue('extra-columns', `Row ${rowNumber}: column${unknown.length > 1 ? 's' : ''} ${unknown.map(u => `'${u}'`).join(', ')} not used`, { row: rowNumber }))
  }
  return cols
}

export function columnsWithoutHeader(row: string[], decimalCode: number, forced: SeriesLayout | undefined): Columns {
  const second = (row[1] ?? '').trim()
  const layout = forced ?? (second === '' || numberOrNull(second, decimalCode) !== null ? 'wide' : 'long')
  return layout === 'long'
    ? { layout, time: 0, channel: 1, conc: 2, ambient: -1, mask: -1 }
    : { layout, time: 0, channel: -1, conc: -1, ambient: 1, mask: 2 }
}

export function median(values: Float64Array): number {
  values.sort()
  const mid = values.length >> 1
  return values.length % 2 ? values[mid]! : (values[mid - 1]! + values[mid]!) / 2
}

export function formatSeconds(s: number): string {
  return Number.isInteger(s) ? String(s) : s.toFixed(2).replace(/\.?0+$/, '')
}
