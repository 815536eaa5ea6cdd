import Papa from 'papaparse'
import type { ParseResult } from 'papaparse'
import type { ComputeIssue } from './errors'
import { errorIssue, warningIssue } from './errors'
import type { ExerciseInput, WholeTestAmbient } from './fit-test'
import type { PhaseWindow, Protocol } from './protocols'
import { protocolTimeline } from './protocols'
import { readTypedNumber } from '../number-reader'
import type { DecimalMark, NumberReading } from '../number-reader'

// Count series: readings pasted or uploaded as text, in a column layout of Sealwright's own.
//
// Long layout (one reading per line):      Wide layout (one line per instant):
//   t,channel,conc                           t,ambient,mask
//   0,ambient,8123.4                         0,8123.4,
//   1,ambient,8090.2                         1,8090.2,
//   14,mask,12.7                             14,,12.7
//
//   t        seconds from the start of the test (a number), or an ISO-8601 timestamp
//            (2025-03-04T09:15:02Z; t = 0 is the first timestamp unless `startTime` is given)
//   channel  ambient | mask  (also a, amb, m, in-mask, inmask; any letter case)
//   conc     concentration in particles/cm³
//   ambient, mask   in the wide layout: the concentration on each channel; either may be blank
//
// Comma, tab or semicolon separated (detected from the first lines; papaparse then reads the
// text, quotes included). Numbers are read with the organization's decimal mark (`decimalMark`,
// point by default): with a point, a comma only groups thousands ("12,500"); with a comma, the
// mirror image, and a comma-separated file must quote its decimals or use tabs or semicolons.
// The header line is optional; column names may carry a unit in brackets ("conc (1/cm³)").
// Without a header the columns are t,channel,conc when the second cell is a word, otherwise
// t,ambient,mask. Rows and columns in issues are 1-based, as the user sees them.

export type Channel = 'ambient' | 'mask'
export type SeriesLayout = 'long' | 'wide'

export interface CountReading {
  row: number
  seconds: number
  channel: Channel
  concentration: number
}

export interface ReadSeriesOptions {
  layout?: SeriesLayout
  // ISO-8601 instant taken as t = 0 when times are timestamps
  startTime?: string
  // longest pause between readings before a gap is reported; default 2 × the detected period
  maxGapSeconds?: number
  // the organization's decimal mark; default point
  decimalMark?: DecimalMark
}

export interface ReadSeriesResult {
  readings: CountReading[]
  issues: ComputeIssue[]
  layout: SeriesLayout | null
  delimiter: string | null
  hasHeader: boolean
  timeFormat: 'seconds' | 'iso' | null
  // median spacing of the readings in seconds; null with fewer than two distinct times
  samplePeriodSeconds: number | null
}

const ISO_TIME = /^\d{4}-\d{2}-\d{2}[T ]\d{2}:\d{2}(?::\d{2}(?:\.\d+)?)?(?:Z|[+-]\d{2}:?\d{2})?$/i

const TIME_NAMES = new Set(['t', 'time', 'seconds', 'second', 's', 'timestamp', 'elapsed'])
const CHANNEL_NAMES = new Set(['channel', 'ch', 'line'])
const CONC_NAMES = new Set(['conc', 'concentration', 'value', 'particles'])
const AMBIENT_NAMES = new Set(['ambient', 'amb', 'a'])
const MASK_NAMES = new Set(['mask', 'in-mask', 'inmask', 'in mask', 'm'])

const POWERS_OF_TEN = [1, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15]

// A concentration or time as a person writes it, read by the one number reader with the
// organization's decimal mark (DOMAIN.md "Typing numbers"); never guessed from the delimiter.
// Fast path for what a counter writes — an optional sign, up to 15 digits and at most one decimal
// mark — where digits / 10^k is exact-then-rounded once, so it equals Number(text) (both are
// correctly rounded) and what the reader returns. Anything else (grouped thousands, exponents,
// refusals) goes to the reader, whose message says what it read and how to write it.
function parseNumber(cell: string, decimalCode: number): NumberReading | number {
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

function numberOrNull(cell: string, decimalCode: number): number | null {
  const read = parseNumber(cell, decimalCode)
  if (typeof read === 'number') return read
  return read.ok ? read.value : null
}

function parseChannel(cell: string): Channel | null {
  if (cell === 'mask') return 'mask'
  if (cell === 'ambient') return 'ambient'
  const c = cell.toLowerCase()
  if (AMBIENT_NAMES.has(c)) return 'ambient'
  if (MASK_NAMES.has(c)) return 'mask'
  return null
}

function headerName(cell: string): string {
  return cell.trim().toLowerCase().replace(/\s*[([].*$/, '').trim()
}

function isTimeCell(cell: string, decimalCode: number): boolean {
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

function detectNewline(text: string): '\n' | '\r\n' | '\r' {
  const n = text.indexOf('\n')
  if (n > 0 && text.charCodeAt(n - 1) === 13) return '\r\n'
  if (n < 0 && text.indexOf('\r') >= 0) return '\r'
  return '\n'
}

interface Columns {
  layout: SeriesLayout
  time: number
  channel: number
  conc: number
  ambient: number
  mask: number
}

function columnsFromHeader(row: string[], rowNumber: number, forced: SeriesLayout | undefined, issues: ComputeIssue[]): Columns | null {
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

function columnsWithoutHeader(row: string[], decimalCode: number, forced: SeriesLayout | undefined): Columns {
  const second = (row[1] ?? '').trim()
  const layout = forced ?? (second === '' || numberOrNull(second, decimalCode) !== null ? 'wide' : 'long')
  return layout === 'long'
    ? { layout, time: 0, channel: 1, conc: 2, ambient: -1, mask: -1 }
    : { layout, time: 0, channel: -1, conc: -1, ambient: 1, mask: 2 }
}

function median(values: Float64Array): number {
  values.sort()
  const mid = values.length >> 1
  return values.length % 2 ? values[mid]! : (values[mid - 1]! + values[mid]!) / 2
}

function formatSeconds(s: number): string {
  return Number.isInteger(s) ? String(s) : s.toFixed(2).replace(/\.?0+$/, '')
}

// Reads a count series from text. Never throws: every problem becomes an issue with its row and
// column, and the readings that could be read are returned sorted by time.
export function readCountSeries(input: unknown, options: ReadSeriesOptions = {}): ReadSeriesResult {
  const issues: ComputeIssue[] = []
  const empty: ReadSeriesResult = { readings: [], issues, layout: null, delimiter: null, hasHeader: false, timeFormat: null, samplePeriodSeconds: null }
  if (typeof input !== 'string' || input.trim() === '') {
    issues.push(errorIssue('empty-series', 'The count series is empty; paste readings as t,channel,conc or t,ambient,mask'))
    return empty
  }
  // A byte-order mark from a spreadsheet export would otherwise stick to the first header name.
  const text = input.charCodeAt(0) === 0xFEFF ? input.slice(1) : input

  let parsed: ParseResult<string[]>
  try {
    parsed = Papa.parse<string[]>(text, { delimiter: detectDelimiter(text), newline: detectNewline(text), skipEmptyLines: false })
  } catch {
    issues.push(errorIssue('unknown-layout', 'The count series could not be read as comma, tab or semicolon separated text'))
    return empty
  }
  const delimiter = parsed.meta.delimiter
  const decimalCode = options.decimalMark === 'comma' ? 44 : 46
  for (const e of parsed.errors) {
    if (e.type === 'Quotes') {
      const row = (e.row ?? 0) + 1
      issues.push(errorIssue('unknown-layout', `Row ${row}: unmatched quote mark`, { row }))
    }
  }

  const rows = parsed.data
  let first = 0
  while (first < rows.length && rows[first]!.every(c => c.trim() === '')) first++
  if (first === rows.length) {
    issues.push(errorIssue('empty-series', 'The count series is empty; paste readings as t,channel,conc or t,ambient,mask'))
    return { ...empty, delimiter }
  }

  const firstRow = rows[first]!
  const hasHeader = !isTimeCell((firstRow[0] ?? '').trim(), decimalCode)
  let cols: Columns | null
  let dataStart: number
  if (hasHeader) {
    cols = columnsFromHeader(firstRow, first + 1, options.layout, issues)
    dataStart = first + 1
  } else {
    cols = columnsWithoutHeader(firstRow, decimalCode, options.layout)
    dataStart = first
    if (firstRow.length < 3 && cols.layout === 'long') {
      issues.push(errorIssue('unknown-layout', `Row ${first + 1}: expected three columns, t, channel and conc (or t, ambient, mask)`, { row: first + 1 }))
      cols = null
    }
  }
  if (!cols) return { ...empty, delimiter, hasHeader }

  let startMs: number | null = null
  if (options.startTime !== undefined) {
    const ms = ISO_TIME.test(options.startTime) ? Date.parse(options.startTime.replace(' ', 'T')) : NaN
    if (Number.isFinite(ms)) startMs = ms
    else issues.push(errorIssue('time-format', `Start time '${options.startTime}' is not an ISO-8601 timestamp`, { field: 'startTime' }))
  }

  const readings: CountReading[] = []
  const lastByChannel = { ambient: -Infinity, mask: -Infinity }
  let timeFormat: 'seconds' | 'iso' | null = null
  let sorted = true
  let lastSeconds = -Infinity
  const channelColumn = cols.channel + 1

  const add = (row: number, seconds: number, channel: Channel, concentration: number): void => {
    if (seconds < lastByChannel[channel]) {
      issues.push(errorIssue(
        'time-backwards',
        `Row ${row}: time goes backwards (t = ${formatSeconds(seconds)} s after ${formatSeconds(lastByChannel[channel])} s on the ${channel} channel); the reading was left out`,
        { row, column: cols!.time + 1 }
      ))
      return
    }
    lastByChannel[channel] = seconds
    if (seconds < lastSeconds) sorted = false
    lastSeconds = seconds
    readings.push({ row, seconds, channel, concentration })
  }

  const readConc = (cell: string, row: number, column: number, label: string): number | null => {
    const read = parseNumber(cell, decimalCode)
    if (typeof read !== 'number' && !read.ok) {
      issues.push(errorIssue('not-a-number', `Row ${row}, column ${column} (${label}): ${read.message}`, { row, column }))
      return null
    }
    const value = typeof read === 'number' ? read : read.value
    if (value < 0) {
      issues.push(errorIssue('negative', `Row ${row}, column ${column}: ${label} cannot be negative (${cell})`, { row, column }))
      return null
    }
    return value
  }

  for (let r = dataStart; r < rows.length; r++) {
    const cells = rows[r]!
    const row = r + 1
    if (cells.length === 1 && cells[0]!.trim() === '') continue

    const timeCell = (cells[cols.time] ?? '').trim()
    if (timeCell === '') {
      if (cells.every(c => c.trim() === '')) continue
      issues.push(errorIssue('missing', `Row ${row}, column ${cols.time + 1}: time is missing`, { row, column: cols.time + 1 }))
      continue
    }
    let seconds: number | null = null
    const timeRead = parseNumber(timeCell, decimalCode)
    const numeric = typeof timeRead === 'number' ? timeRead : timeRead.ok ? timeRead.value : null
    if (numeric !== null && timeFormat !== 'iso') {
      seconds = numeric
      timeFormat = 'seconds'
    } else if (numeric === null && timeFormat !== 'seconds' && ISO_TIME.test(timeCell)) {
      const ms = Date.parse(timeCell.replace(' ', 'T'))
      if (Number.isFinite(ms)) {
        if (startMs === null) startMs = ms
        seconds = (ms - startMs) / 1000
        timeFormat = 'iso'
      }
    }
    if (seconds === null && timeFormat !== 'iso' && typeof timeRead !== 'number' && !timeRead.ok && /^[+\-\u2212]?[\d.,]/.test(timeCell) && !ISO_TIME.test(timeCell)) {
      issues.push(errorIssue('time-format', `Row ${row}, column ${cols.time + 1} (time): ${timeRead.message}`, { row, column: cols.time + 1 }))
      continue
    }
    if (seconds === null) {
      const expected = timeFormat === 'iso' ? 'an ISO-8601 timestamp like the rows above' : timeFormat === 'seconds' ? 'seconds from the start like the rows above' : 'seconds from the start or an ISO-8601 timestamp'
      issues.push(errorIssue('time-format', `Row ${row}, column ${cols.time + 1}: time '${timeCell}' should be ${expected}`, { row, column: cols.time + 1 }))
      continue
    }

    if (cols.layout === 'long') {
      const channelCell = (cells[cols.channel] ?? '').trim()
      const concCell = (cells[cols.conc] ?? '').trim()
      const channel = parseChannel(channelCell)
      if (!channel) {
        issues.push(channelCell === ''
          ? errorIssue('missing', `Row ${row}, column ${channelColumn}: channel is missing; write ambient or mask`, { row, column: channelColumn })
          : errorIssue('unknown-channel', `Row ${row}, column ${channelColumn}: channel '${channelCell}' should be ambient or mask`, { row, column: channelColumn }))
        continue
      }
      if (concCell === '') {
        issues.push(errorIssue('missing', `Row ${row}, column ${cols.conc + 1}: concentration is missing`, { row, column: cols.conc + 1 }))
        continue
      }
      const conc = readConc(concCell, row, cols.conc + 1, 'concentration')
      if (conc !== null) add(row, seconds, channel, conc)
    } else {
      const ambientCell = cols.ambient >= 0 ? (cells[cols.ambient] ?? '').trim() : ''
      const maskCell = cols.mask >= 0 ? (cells[cols.mask] ?? '').trim() : ''
      if (ambientCell === '' && maskCell === '') {
        issues.push(errorIssue('missing', `Row ${row}: neither an ambient nor a mask concentration is given`, { row }))
        continue
      }
      if (ambientCell !== '') {
        const conc = readConc(ambientCell, row, cols.ambient + 1, 'ambient concentration')
        if (conc !== null) add(row, seconds, 'ambient', conc)
      }
      if (maskCell !== '') {
        const conc = readConc(maskCell, row, cols.mask + 1, 'mask concentration')
        if (conc !== null) add(row, seconds, 'mask', conc)
      }
    }
  }

  if (!sorted) readings.sort((a, b) => a.seconds - b.seconds)

  // Sample period: median spacing of distinct times. Gaps are pauses longer than maxGapSeconds.
  let samplePeriodSeconds: number | null = null
  if (readings.length > 1) {
    const diffs = new Float64Array(readings.length - 1)
    let n = 0
    for (let i = 1; i < readings.length; i++) {
      const d = readings[i]!.seconds - readings[i - 1]!.seconds
      if (d > 0) diffs[n++] = d
    }
    if (n > 0) samplePeriodSeconds = median(diffs.subarray(0, n))
  }
  const maxGap = options.maxGapSeconds ?? (samplePeriodSeconds !== null ? 2 * samplePeriodSeconds : null)
  if (maxGap !== null && Number.isFinite(maxGap) && maxGap > 0) {
    for (let i = 1; i < readings.length; i++) {
      const prev = readings[i - 1]!
      const cur = readings[i]!
      const d = cur.seconds - prev.seconds
      if (d > maxGap) {
        issues.push(warningIssue(
          'gap',
          `Row ${cur.row}: no readings for ${formatSeconds(d)} s (t = ${formatSeconds(prev.seconds)} s to ${formatSeconds(cur.seconds)} s); the counter may have paused`,
          { row: cur.row, column: cols.time + 1 }
        ))
      }
    }
  }

  return { readings, issues, layout: cols.layout, delimiter, hasHeader, timeFormat, samplePeriodSeconds }
}

// ---------------------------------------------------------------------------------------------
// Segmentation by the protocol's timeline.

export interface SegmentOptions {
  // series time (seconds) at which the test started; default 0
  offsetSeconds?: number
}

export interface PhaseMean {
  mean: number
  readings: number
  startSeconds: number
  endSeconds: number
}

export interface ExerciseSegment {
  exerciseKey: string
  exerciseName: string
  counted: boolean
  startSeconds: number
  endSeconds: number
  ambientBefore: PhaseMean | null
  ambientAfter: PhaseMean | null
  // continuous ambient plan: ambient readings taken during the in-mask sample
  ambientMean: PhaseMean | null
  inMask: PhaseMean | null
}

export interface SegmentResult {
  segments: ExerciseSegment[]
  issues: ComputeIssue[]
  // readings that fell in purges, idle time, or on the other channel than the phase samples
  unusedReadings: number
}

// Splits sorted readings into the protocol's phases and averages each phase. Readings must be
// sorted by time (readCountSeries returns them so).
export function segmentCountSeries(readings: readonly CountReading[], protocol: Protocol, options: SegmentOptions = {}): SegmentResult {
  const issues: ComputeIssue[] = []
  const timeline = protocolTimeline(protocol)
  const offset = options.offsetSeconds ?? 0
  const continuous = protocol.ambientPlan === 'continuous'

  const phases: PhaseWindow[] = []
  for (const w of timeline.exercises) for (const ph of w.phases) phases.push(ph)
  const phaseIndex = new Map<PhaseWindow, number>()
  phases.forEach((ph, i) => phaseIndex.set(ph, i))

  const ambientSum = new Float64Array(phases.length)
  const ambientN = new Uint32Array(phases.length)
  const maskSum = new Float64Array(phases.length)
  const maskN = new Uint32Array(phases.length)

  let unused = 0
  let mismatched = 0
  let firstMismatchRow = 0
  let outsideRun: { firstRow: number, lastRow: number, from: number, to: number, count: number } | null = null
  const flushOutside = (): void => {
    if (!outsideRun) return
    const { firstRow, lastRow, from, to, count } = outsideRun
    const rows = firstRow === lastRow ? `Row ${firstRow}` : `Rows ${firstRow}–${lastRow}`
    const times = from === to ? `t = ${formatSeconds(from)} s` : `t = ${formatSeconds(from)}–${formatSeconds(to)} s`
    issues.push(warningIssue(
      'outside-protocol',
      `${rows} (${times}, ${count} reading${count > 1 ? 's' : ''}) fall outside the ${timeline.durationSeconds} s of the ${protocol.name} and were not used`,
      { row: firstRow }
    ))
    outsideRun = null
  }

  let p = 0
  for (const reading of readings) {
    const t = reading.seconds - offset
    if (t < 0 || t >= timeline.durationSeconds || phases.length === 0) {
      if (outsideRun) {
        outsideRun.lastRow = reading.row
        outsideRun.to = reading.seconds
        outsideRun.count++
      } else {
        outsideRun = { firstRow: reading.row, lastRow: reading.row, from: reading.seconds, to: reading.seconds, count: 1 }
      }
      continue
    }
    flushOutside()
    if (t < phases[p]!.startSeconds) p = 0
    while (p < phases.length - 1 && t >= phases[p]!.endSeconds) p++
    const phase = phases[p]!
    if (phase.kind === 'ambient') {
      if (reading.channel === 'ambient') {
        ambientSum[p]! += reading.concentration
        ambientN[p]!++
      } else {
        unused++
        if (!mismatched++) firstMismatchRow = reading.row
      }
    } else if (phase.kind === 'mask') {
      if (reading.channel === 'mask') {
        maskSum[p]! += reading.concentration
        maskN[p]!++
      } else if (continuous) {
        ambientSum[p]! += reading.concentration
        ambientN[p]!++
      } else {
        unused++
        if (!mismatched++) firstMismatchRow = reading.row
      }
    } else {
      unused++
    }
  }
  flushOutside()

  if (mismatched > 0) {
    issues.push(warningIssue(
      'channel-phase-mismatch',
      `${mismatched} reading${mismatched > 1 ? 's were' : ' was'} taken on the other channel than the protocol samples at that time (first at row ${firstMismatchRow}) and not used; check that the series starts at the start of the test`,
      { row: firstMismatchRow }
    ))
  }

  const mean = (sum: Float64Array, n: Uint32Array, ph: PhaseWindow | null): PhaseMean | null => {
    if (!ph) return null
    const i = phaseIndex.get(ph)!
    return n[i]! > 0 ? { mean: sum[i]! / n[i]!, readings: n[i]!, startSeconds: ph.startSeconds + offset, endSeconds: ph.endSeconds + offset } : null
  }

  // With nothing usable at all, one issue says so instead of one per exercise.
  const nothingUsable = readings.length === 0
  if (nothingUsable) {
    issues.push(errorIssue('empty-series', `No readings could be used for the ${protocol.name}`))
  }
  const reportedAmbient = new Set<PhaseWindow>()
  const segments: ExerciseSegment[] = timeline.exercises.map((w) => {
    const where = { exerciseKey: w.exerciseKey, exerciseName: w.exerciseName }
    const inMask = mean(maskSum, maskN, w.mask)
    const segment: ExerciseSegment = {
      exerciseKey: w.exerciseKey,
      exerciseName: w.exerciseName,
      counted: w.counted,
      startSeconds: w.startSeconds + offset,
      endSeconds: w.endSeconds + offset,
      ambientBefore: mean(ambientSum, ambientN, w.ambientBefore),
      ambientAfter: mean(ambientSum, ambientN, w.ambientAfter),
      ambientMean: continuous ? mean(ambientSum, ambientN, w.mask) : null,
      inMask
    }
    if (!w.counted || !w.mask || nothingUsable) return segment
    const span = (ph: PhaseWindow): string => `t = ${formatSeconds(ph.startSeconds + offset)}–${formatSeconds(ph.endSeconds + offset)} s`
    if (!inMask) {
      issues.push(errorIssue('no-in-mask-readings', `No in-mask readings for '${w.exerciseName}' (${span(w.mask)})`, { ...where, field: 'inMask' }))
    }
    const checkAmbient = (ph: PhaseWindow | null, got: PhaseMean | null, field: 'ambientBefore' | 'ambientAfter'): void => {
      if (!ph || got || reportedAmbient.has(ph)) return
      reportedAmbient.add(ph)
      const message = protocol.ambientPlan === 'whole-test'
        ? `No ambient readings at the ${field === 'ambientBefore' ? 'start' : 'end'} of the test (${span(ph)})`
        : `No ambient readings ${field === 'ambientBefore' ? 'before' : 'after'} '${w.exerciseName}' (${span(ph)})`
      issues.push(errorIssue('no-ambient-readings', message, protocol.ambientPlan === 'whole-test' ? { field } : { ...where, field }))
    }
    if (continuous) {
      if (!segment.ambientMean) {
        issues.push(errorIssue('no-ambient-readings', `No ambient readings during '${w.exerciseName}' (${span(w.mask)})`, { ...where, field: 'ambientMean' }))
      }
    } else {
      checkAmbient(w.ambientBefore, segment.ambientBefore, 'ambientBefore')
      checkAmbient(w.ambientAfter, segment.ambientAfter, 'ambientAfter')
    }
    return segment
  })

  return { segments, issues, unusedReadings: unused }
}

export interface CountSeriesResult extends ReadSeriesResult {
  segments: ExerciseSegment[]
  unusedReadings: number
}

// Reads and segments a count series in one go: { readings, segments, issues } and the details.
export function parseCountSeries(
  text: unknown,
  protocol: Protocol,
  options: ReadSeriesOptions & SegmentOptions = {}
): CountSeriesResult {
  const read = readCountSeries(text, options)
  const segmented = segmentCountSeries(read.readings, protocol, options)
  // When reading already failed, "no readings could be used" would only repeat it.
  const readFailed = read.readings.length === 0 && read.issues.some(i => i.severity === 'error')
  const segmentIssues = readFailed ? segmented.issues.filter(i => i.code !== 'empty-series') : segmented.issues
  return {
    ...read,
    issues: read.issues.concat(segmentIssues),
    segments: segmented.segments,
    unusedReadings: segmented.unusedReadings
  }
}

// Turns segments into computeFitTest inputs (the in-mask seconds are the protocol's).
export function segmentsToFitTestInputs(segments: readonly ExerciseSegment[], protocol: Protocol): {
  exercises: ExerciseInput[]
  wholeTestAmbient: WholeTestAmbient | null
} {
  const exercises: ExerciseInput[] = segments
    .filter(s => s.inMask || s.counted)
    .map(s => ({
      exerciseKey: s.exerciseKey,
      ambientBefore: s.ambientBefore?.mean ?? null,
      ambientAfter: s.ambientAfter?.mean ?? null,
      ambientMean: s.ambientMean?.mean ?? null,
      inMask: s.inMask?.mean ?? null
    }))
  let wholeTestAmbient: WholeTestAmbient | null = null
  if (protocol.ambientPlan === 'whole-test') {
    const withAmbient = segments.find(s => s.counted && (s.ambientBefore || s.ambientAfter))
    wholeTestAmbient = { start: withAmbient?.ambientBefore?.mean ?? null, end: withAmbient?.ambientAfter?.mean ?? null }
  }
  return { exercises, wholeTestAmbient }
}
