// Count series, third layer: segmentation of sorted readings by the protocol's timeline, and the
// step from segments to computeFitTest inputs.
import type { ComputeIssue } from './errors'
import { errorIssue, warningIssue } from './errors'
import type { ExerciseInput, WholeTestAmbient } from './fit-test'
import type { PhaseWindow, Protocol } from './protocols'
import { protocolTimeline } from './protocols'
import { formatSeconds } from './count-series-cells'
import type { CountReading, ReadSeriesOptions, ReadSeriesResult } from './count-series-rows'
import { readCountSeries } from './count-series-rows'

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
