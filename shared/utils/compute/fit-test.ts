import { FIT_TEST_CAUTIONS } from './cautions'
import { DEFAULT_CONFIDENCE, poissonInterval, sampleVolumeCm3 } from './counting-stats'
import type { ComputeIssue } from './errors'
import { checkNonNegative, checkPositive, errorIssue, warningIssue } from './errors'
import type { FitFactorValue } from './fit-factor'
import {
  exerciseFitFactor,
  formatFitFactor,
  harmonicMeanFitFactor,
  meanAmbient,
  meetsPassLevel,
  zeroCountFitFactorBound
} from './fit-factor'
import type { Protocol, ProtocolExercise } from './protocols'
import type { ExerciseInput, ExerciseResult, FitTestInput, FitTestResult } from '../../types/fit-test'

export type {
  ExerciseInput, ExerciseResult, FitFactorInterval, FitTestFailure, FitTestInput, FitTestResult, FitTestSuccess,
  LimitingExercise, WholeTestAmbient
} from '../../types/fit-test'

const FIELD_LABELS = {
  ambientBefore: 'Ambient before',
  ambientAfter: 'Ambient after',
  ambientMean: 'Ambient',
  inMask: 'In-mask concentration',
  inMaskCount: 'In-mask count',
  inMaskSeconds: 'In-mask sample seconds'
} as const

type FieldKey = keyof typeof FIELD_LABELS

function subject(field: FieldKey, exercise: ProtocolExercise): string {
  return `${FIELD_LABELS[field]} for '${exercise.name}'`
}

function emptyResult(exercise: ProtocolExercise): ExerciseResult {
  return {
    exerciseKey: exercise.key,
    exerciseName: exercise.name,
    counted: exercise.counted,
    ambient: null,
    inMask: null,
    sampleVolumeCm3: null,
    fitFactor: null,
    interval: null,
    penetrationShare: null,
    limiting: false
  }
}

interface Context {
  protocol: Protocol
  flow: number | null
  wholeTest: { start: number, end: number } | null
  confidence: number
  intervals: boolean
}

// Works out one exercise. Pushes its issues; returns the result (fitFactor null on error).
function where(exercise: ProtocolExercise, field: string): Partial<ComputeIssue> {
  return { exerciseKey: exercise.key, exerciseName: exercise.name, field }
}

// Fast path for a valid value; the subject text and the issue are built only when it is wrong.
function positive(value: unknown, field: FieldKey, exercise: ProtocolExercise, issues: ComputeIssue[]): number | null {
  if (typeof value === 'number' && value > 0 && value !== Infinity) return value
  const checked = checkPositive(value, subject(field, exercise), where(exercise, field))
  if (!checked.ok) issues.push(checked.issue)
  return null
}

function nonNegative(value: unknown, field: FieldKey, exercise: ProtocolExercise, issues: ComputeIssue[]): number | null {
  if (typeof value === 'number' && value >= 0 && value !== Infinity) return value
  const checked = checkNonNegative(value, subject(field, exercise), where(exercise, field))
  if (!checked.ok) issues.push(checked.issue)
  return null
}

const given = (value: unknown): boolean => value !== undefined && value !== null

// Works out one exercise. Pushes its issues; returns the result (fitFactor null on error).
function computeExercise(exercise: ProtocolExercise, input: ExerciseInput, ctx: Context, issues: ComputeIssue[]): ExerciseResult {
  const result = emptyResult(exercise)
  const before = issues.length

  let ambient: number | null = null
  if (ctx.protocol.ambientPlan === 'per-exercise') {
    const b = positive(input.ambientBefore, 'ambientBefore', exercise, issues)
    const a = positive(input.ambientAfter, 'ambientAfter', exercise, issues)
    if (b !== null && a !== null) ambient = meanAmbient(b, a)
  } else if (ctx.protocol.ambientPlan === 'continuous') {
    ambient = positive(input.ambientMean, 'ambientMean', exercise, issues)
  } else if (ctx.wholeTest) {
    ambient = meanAmbient(ctx.wholeTest.start, ctx.wholeTest.end)
  }

  let seconds: number | null = null
  if (given(input.inMaskSeconds)) {
    seconds = positive(input.inMaskSeconds, 'inMaskSeconds', exercise, issues)
  } else if (exercise.sampling.maskSeconds > 0) {
    seconds = exercise.sampling.maskSeconds
  }
  const volume = ctx.flow !== null && seconds !== null ? sampleVolumeCm3(ctx.flow, seconds) : null

  let count: number | null = null
  if (given(input.inMaskCount)) {
    count = nonNegative(input.inMaskCount, 'inMaskCount', exercise, issues)
    if (count !== null && !Number.isInteger(count)) {
      issues.push(errorIssue('not-a-number', `${subject('inMaskCount', exercise)} must be a whole number of particles`, where(exercise, 'inMaskCount')))
      count = null
    }
  }

  let inMask: number | null = null
  if (given(input.inMask)) {
    inMask = nonNegative(input.inMask, 'inMask', exercise, issues)
  } else if (count !== null && volume !== null) {
    inMask = count / volume
  } else if (count === null) {
    issues.push(errorIssue('missing', `${subject('inMask', exercise)} is missing; enter zero or a positive number`, where(exercise, 'inMask')))
  } else {
    issues.push(errorIssue('missing', `${subject('inMask', exercise)} is missing; enter it, or the sample flow so it can be worked out from the count`, where(exercise, 'inMask')))
  }

  result.ambient = ambient
  result.inMask = inMask
  result.sampleVolumeCm3 = volume
  if (issues.length > before || ambient === null || inMask === null) return result

  if (inMask === 0) {
    if (volume === null) {
      issues.push(errorIssue(
        'zero-without-volume',
        `${subject('inMask', exercise)} is zero; enter the sample flow so a lower bound on the fit factor can be given`,
        where(exercise, 'inMask')
      ))
      return result
    }
    result.fitFactor = zeroCountFitFactorBound(ambient, volume, ctx.confidence)
    result.interval = {
      lower: result.fitFactor.value,
      upper: null,
      confidence: ctx.confidence,
      inMaskCount: 0,
      countEstimated: count === null
    }
    return result
  }

  const ff = exerciseFitFactor(ambient, inMask)
  if (!Number.isFinite(ff)) {
    issues.push(errorIssue('not-positive', `${subject('inMask', exercise)} is too small to give a fit factor`, where(exercise, 'inMask')))
    return result
  }
  result.fitFactor = { value: ff, isLowerBound: false }
  if (ctx.intervals && volume !== null) {
    const n = count ?? inMask * volume
    const g = poissonInterval(n, ctx.confidence, 'fast')
    result.interval = {
      lower: (ambient * volume) / g.upper,
      upper: g.lower > 0 ? (ambient * volume) / g.lower : null,
      confidence: ctx.confidence,
      inMaskCount: n,
      countEstimated: count === null
    }
  }
  return result
}

// Everything a page or a route needs from one quantitative fit test's raw inputs: per-exercise
// fit factors (and intervals where counts or volumes are known), the overall fit factor, the
// limiting exercise, each exercise's share of the penetration and the verdict. Never throws on
// bad input: problems come back as issues naming the exercise and field.
export function computeFitTest(input: FitTestInput): FitTestResult {
  const { protocol } = input
  const issues: ComputeIssue[] = []
  const confidence = input.confidence ?? DEFAULT_CONFIDENCE

  const level = checkPositive(input.passLevel, 'Pass level', { field: 'passLevel' })
  if (!level.ok) issues.push(level.issue)

  let flow: number | null = null
  if (input.sampleFlowCm3PerMin !== undefined && input.sampleFlowCm3PerMin !== null) {
    const f = checkPositive(input.sampleFlowCm3PerMin, 'Sample flow (cm³/min)', { field: 'sampleFlowCm3PerMin' })
    if (f.ok) flow = f.value
    else issues.push(f.issue)
  }

  let wholeTest: Context['wholeTest'] = null
  if (protocol.ambientPlan === 'whole-test') {
    const s = checkPositive(input.wholeTestAmbient?.start, 'Ambient at the start of the test', { field: 'ambientStart' })
    const e = checkPositive(input.wholeTestAmbient?.end, 'Ambient at the end of the test', { field: 'ambientEnd' })
    if (!s.ok) issues.push(s.issue)
    if (!e.ok) issues.push(e.issue)
    if (s.ok && e.ok) wholeTest = { start: s.value, end: e.value }
  }

  const inputs = new Map<string, ExerciseInput>()
  for (const ex of input.exercises) {
    if (inputs.has(ex.exerciseKey)) {
      const name = protocol.exercises.find(p => p.key === ex.exerciseKey)?.name ?? ex.exerciseKey
      issues.push(errorIssue('duplicate-exercise', `'${name}' is entered twice; keep one set of readings`, { exerciseKey: ex.exerciseKey, exerciseName: name }))
      continue
    }
    inputs.set(ex.exerciseKey, ex)
  }
  for (const key of inputs.keys()) {
    if (!protocol.exercises.some(p => p.key === key)) {
      issues.push(errorIssue('unknown-exercise', `Exercise '${key}' is not part of the ${protocol.name}`, { exerciseKey: key }))
    }
  }

  const ctx: Context = { protocol, flow, wholeTest, confidence, intervals: input.intervals ?? true }
  const exercises: ExerciseResult[] = []
  const countedValues: number[] = []
  const countedIndexes: number[] = []
  let anyLowerBound = false
  let countedComplete = true

  for (const exercise of protocol.exercises) {
    const entered = inputs.get(exercise.key)
    if (!entered) {
      if (exercise.counted) {
        issues.push(errorIssue('missing-exercise', `No readings entered for '${exercise.name}'`, { exerciseKey: exercise.key, exerciseName: exercise.name }))
        countedComplete = false
      }
      exercises.push(emptyResult(exercise))
      continue
    }
    const result = computeExercise(exercise, entered, ctx, issues)
    exercises.push(result)
    if (!exercise.counted) continue
    if (result.fitFactor) {
      countedValues.push(result.fitFactor.value)
      countedIndexes.push(exercises.length - 1)
      if (result.fitFactor.isLowerBound) anyLowerBound = true
    } else {
      countedComplete = false
    }
  }

  const hasError = issues.some(i => i.severity === 'error')
  if (hasError || !countedComplete || !level.ok || countedValues.length === 0) {
    return {
      ok: false,
      protocolKey: protocol.key,
      exercises,
      overall: null,
      overallText: null,
      limiting: null,
      passLevel: level.ok ? level.value : null,
      pass: null,
      issues,
      cautions: FIT_TEST_CAUTIONS
    }
  }

  // Overall fit factor: harmonic mean of the counted exercises, n / Σ(1/ffᵢ).
  // 29 CFR 1910.134 App. A, Part I.C.2(c) (formula from memory, high confidence).
  let reciprocalSum = 0
  for (const v of countedValues) reciprocalSum += 1 / v
  const overall: FitFactorValue = { value: harmonicMeanFitFactor(countedValues), isLowerBound: anyLowerBound }

  let limitingPos = 0
  for (let i = 0; i < countedValues.length; i++) {
    const index = countedIndexes[i]!
    exercises[index]!.penetrationShare = 1 / countedValues[i]! / reciprocalSum
    if (countedValues[i]! < countedValues[limitingPos]!) limitingPos = i
  }
  const limitingResult = exercises[countedIndexes[limitingPos]!]!
  limitingResult.limiting = true

  const pass = meetsPassLevel(overall.value, level.value)
  if (overall.isLowerBound && !pass) {
    issues.push(warningIssue(
      'lower-bound-below-level',
      `The overall fit factor is only known to be above ${formatFitFactor(overall.value)}, because an in-mask count was zero; a longer in-mask sample or a higher ambient concentration would settle whether it reaches ${level.value}`
    ))
  }

  return {
    ok: true,
    protocolKey: protocol.key,
    exercises,
    overall,
    overallText: formatFitFactor(overall),
    limiting: {
      exerciseKey: limitingResult.exerciseKey,
      exerciseName: limitingResult.exerciseName,
      fitFactor: limitingResult.fitFactor!,
      penetrationShare: limitingResult.penetrationShare!
    },
    passLevel: level.value,
    pass,
    issues,
    cautions: FIT_TEST_CAUTIONS
  }
}
