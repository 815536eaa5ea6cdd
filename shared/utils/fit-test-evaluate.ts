// One place that turns a stored (or typed) fit test into its result, used by the server to
// recompute what it stores and by the browser for the instant preview.
import type { ComputeIssue, FitTestResult, Protocol } from './compute'
import { computeFitTest, parseCountSeries, segmentsToFitTestInputs } from './compute'
import type { FitTestEntry } from './fit-test-schemas'
import type { FitTestKind } from './enums'

export interface StoredFields {
  passLevel: number | null
  overallFitFactor: number | null
  overallIsLowerBound: boolean | null
  passed: boolean | null
  limitingExerciseKey: string | null
  dueOn: string | null
}

/**
 * The numbers kept beside a revision's raw inputs, for lists and queries only; every page
 * recomputes from the inputs. `testedOn` is the test's calendar date in the site's time zone.
 */
export function storedFieldsOf(input: {
  kind: FitTestKind
  protocol: Protocol | null
  entry: FitTestEntry
  seriesText?: string | null
  sampleFlowCm3PerMin?: number | null
  passLevel: number | null
  testedOn: string
  retestMonths: number
}): { evaluation: Evaluation | null, stored: StoredFields } {
  const dueIfPassed = nextDueDate(input.testedOn, input.retestMonths)
  if (input.kind === 'qualitative' || !input.protocol || input.passLevel === null) {
    const passed = input.entry.qualitative ? input.entry.qualitative.result === 'pass' : null
    return { evaluation: null, stored: { passLevel: null, overallFitFactor: null, overallIsLowerBound: null, passed, limitingExerciseKey: null, dueOn: passed ? dueIfPassed : null } }
  }
  const evaluation = evaluateFitTest({ protocol: input.protocol, entry: input.entry, seriesText: input.seriesText, passLevel: input.passLevel, sampleFlowCm3PerMin: input.sampleFlowCm3PerMin })
  const r = evaluation.result
  return {
    evaluation,
    stored: {
      passLevel: input.passLevel,
      overallFitFactor: r.ok ? r.overall.value : null,
      overallIsLowerBound: r.ok ? r.overall.isLowerBound : null,
      passed: r.ok ? r.pass : null,
      limitingExerciseKey: r.ok ? r.limiting.exerciseKey : null,
      dueOn: r.ok && r.pass ? dueIfPassed : null
    }
  }
}

export interface EvaluationInput {
  protocol: Protocol
  entry: FitTestEntry
  seriesText?: string | null
  passLevel: number
  sampleFlowCm3PerMin?: number | null
}

export interface Evaluation {
  result: FitTestResult
  /** Problems found while reading a pasted series (row and column named), before any computing. */
  seriesIssues: ComputeIssue[]
}

export function evaluateFitTest(input: EvaluationInput): Evaluation {
  const { protocol, entry } = input
  if (entry.mode === 'series') {
    // Read with the decimal mark kept in the entry, so a record recomputes the same after the setting changes.
    const parsed = parseCountSeries(input.seriesText ?? '', protocol, { offsetSeconds: entry.seriesOffsetSeconds, decimalMark: entry.decimalMark ?? 'point' })
    const fromSeries = segmentsToFitTestInputs(parsed.segments, protocol)
    const result = computeFitTest({
      protocol,
      exercises: fromSeries.exercises,
      wholeTestAmbient: fromSeries.wholeTestAmbient,
      passLevel: input.passLevel,
      sampleFlowCm3PerMin: input.sampleFlowCm3PerMin
    })
    return { result, seriesIssues: parsed.issues }
  }
  // An exercise that is performed but not counted (the grimace) may be left blank.
  const notCounted = new Set(protocol.exercises.filter(e => !e.counted).map(e => e.key))
  const exercises = entry.exercises.filter(e => !notCounted.has(e.exerciseKey)
    || [e.ambientBefore, e.ambientAfter, e.ambientMean, e.inMask, e.inMaskCount].some(v => v !== null && v !== undefined))
  const result = computeFitTest({
    protocol,
    exercises,
    wholeTestAmbient: entry.wholeTestAmbient,
    passLevel: input.passLevel,
    sampleFlowCm3PerMin: input.sampleFlowCm3PerMin
  })
  return { result, seriesIssues: [] }
}

/** Empty grid rows for every exercise of a protocol, in order. */
export function blankExerciseEntries(protocol: Protocol): FitTestEntry['exercises'] {
  return protocol.exercises.map(e => ({ exerciseKey: e.key, ambientBefore: null, ambientAfter: null, ambientMean: null, inMask: null, inMaskCount: null }))
}

/**
 * The next test is due `months` after the test date (a calendar date in the site's zone), on the
 * same day of the month or the month's last day — 29 CFR 1910.134(f)(2): at least every 12 months.
 */
export function nextDueDate(testedOn: string, months: number): string {
  const [y, m, d] = testedOn.split('-').map(Number) as [number, number, number]
  const targetMonthIndex = (m - 1) + months
  const year = y + Math.floor(targetMonthIndex / 12)
  const month = ((targetMonthIndex % 12) + 12) % 12
  const lastDay = new Date(Date.UTC(year, month + 1, 0)).getUTCDate()
  const day = Math.min(d, lastDay)
  return `${year}-${String(month + 1).padStart(2, '0')}-${String(day).padStart(2, '0')}`
}

export const MAX_RETEST_INTERVAL_MONTHS = 12

/** An organization may choose a shorter interval than 12 months, never a longer one. */
export function retestIntervalMonths(setting: number | undefined | null): number {
  if (!setting || !Number.isFinite(setting)) return MAX_RETEST_INTERVAL_MONTHS
  return Math.min(MAX_RETEST_INTERVAL_MONTHS, Math.max(1, Math.floor(setting)))
}
