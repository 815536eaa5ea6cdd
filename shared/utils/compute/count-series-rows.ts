// Count series, second layer: the rows — text in, readings sorted by time out, every problem an
// issue with its row and column. The column layout is described in count-series.ts.
import Papa from 'papaparse'
import type { ParseResult } from 'papaparse'
import type { ComputeIssue } from './errors'
import { errorIssue, warningIssue } from './errors'
import type { DecimalMark } from '../number-reader'
import type { Channel, Columns, SeriesLayout } from './count-series-cells'
import {
  columnsFromHeader, columnsWithoutHeader, detectDelimiter, detectNewline, formatSeconds, isTimeCell,
  ISO_TIME, median, parseChannel, parseNumber
} from './count-series-cells'

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

  const samplePeriodSeconds = samplePeriod(readings)
  reportGaps(readings, options.maxGapSeconds ?? (samplePeriodSeconds !== null ? 2 * samplePeriodSeconds : null), cols.time + 1, issues)

  return { readings, issues, layout: cols.layout, delimiter, hasHeader, timeFormat, samplePeriodSeconds }
}

// Sample period: median spacing of distinct times; null with fewer than two distinct times.
function samplePeriod(readings: readonly CountReading[]): number | null {
  if (readings.length < 2) return null
  const diffs = new Float64Array(readings.length - 1)
  let n = 0
  for (let i = 1; i < readings.length; i++) {
    const d = readings[i]!.seconds - readings[i - 1]!.seconds
    if (d > 0) diffs[n++] = d
  }
  return n > 0 ? median(diffs.subarray(0, n)) : null
}

// A pause longer than maxGap between two readings is a warning: the counter may have stopped.
function reportGaps(readings: readonly CountReading[], maxGap: number | null, timeColumn: number, issues: ComputeIssue[]): void {
  if (maxGap === null || !Number.isFinite(maxGap) || maxGap <= 0) return
  for (let i = 1; i < readings.length; i++) {
    const prev = readings[i - 1]!
    const cur = readings[i]!
    const d = cur.seconds - prev.seconds
    if (d > maxGap) {
      issues.push(warningIssue(
        'gap',
        `Row ${cur.row}: no readings for ${formatSeconds(d)} s (t = ${formatSeconds(prev.seconds)} s to ${formatSeconds(cur.seconds)} s); the counter may have paused`,
        { row: cur.row, column: timeColumn }
      ))
    }
  }
}
