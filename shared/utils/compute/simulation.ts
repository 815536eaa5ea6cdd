// The training-lab simulator in four files: simulation-core.ts (seeded random numbers, Poisson
// counts, the input shape), this file (whole simulated tests and their summary),
// pass-probability.ts (the chance of passing, the operating characteristic) and
// simulation-trace.ts (one test second by second). Import them all from here or the index.
import { quantileSorted } from 'simple-statistics'
import { sampleVolumeCm3 } from './counting-stats'
import { exerciseFitFactor, harmonicMeanFitFactor, meanAmbient, meetsPassLevel, zeroCountFitFactorBound } from './fit-factor'
import type { ExerciseInput, FitTestResult } from './fit-test'
import { computeFitTest } from './fit-test'
import type { PhaseWindow } from './protocols'
import { protocolTimeline } from './protocols'
import type { RandomSource, SimulationInput, SimulatedExercise, SimulatedTest } from './simulation-core'
import { mulberry32, samplePoisson, trueFactorFor, validate } from './simulation-core'

function simulateOnce(input: SimulationInput, random: RandomSource, intervals = false): SimulatedTest & { result: FitTestResult } {
  const { protocol } = input
  const timeline = protocolTimeline(protocol)
  const flow = input.sampleFlowCm3PerMin

  // Each ambient phase is measured once, even when two exercises share it.
  const ambientMeasured = new Map<PhaseWindow, number>()
  const measureAmbient = (ph: PhaseWindow | null, fallbackSeconds: number): number => {
    const seconds = ph ? ph.endSeconds - ph.startSeconds : fallbackSeconds
    if (ph) {
      const known = ambientMeasured.get(ph)
      if (known !== undefined) return known
    }
    const volume = sampleVolumeCm3(flow, seconds)
    const value = samplePoisson(input.ambient * volume, random) / volume
    if (ph) ambientMeasured.set(ph, value)
    return value
  }

  const exerciseInputs: ExerciseInput[] = []
  const simulated: SimulatedExercise[] = []
  const trueValues: number[] = []
  let wholeStart = 0
  let wholeEnd = 0
  timeline.exercises.forEach((w, i) => {
    const exercise = protocol.exercises[i]!
    if (!w.counted || !w.mask) return
    const trueFitFactor = trueFactorFor(input, w.exerciseKey)
    trueValues.push(trueFitFactor)
    const maskSeconds = w.mask.endSeconds - w.mask.startSeconds
    const expected = input.ambient * sampleVolumeCm3(flow, maskSeconds) / trueFitFactor
    const inMaskCount = samplePoisson(expected, random)
    const entry: ExerciseInput = { exerciseKey: exercise.key, inMaskCount, inMaskSeconds: maskSeconds }
    if (protocol.ambientPlan === 'per-exercise') {
      entry.ambientBefore = measureAmbient(w.ambientBefore, maskSeconds)
      entry.ambientAfter = measureAmbient(w.ambientAfter, maskSeconds)
    } else if (protocol.ambientPlan === 'continuous') {
      entry.ambientMean = measureAmbient(null, maskSeconds)
    } else {
      wholeStart = measureAmbient(w.ambientBefore, maskSeconds)
      wholeEnd = measureAmbient(w.ambientAfter, maskSeconds)
    }
    exerciseInputs.push(entry)
    simulated.push({
      exerciseKey: exercise.key,
      exerciseName: exercise.name,
      trueFitFactor,
      expectedInMaskCount: expected,
      inMaskCount,
      fitFactor: null
    })
  })

  const result = computeFitTest({
    protocol,
    exercises: exerciseInputs,
    passLevel: input.passLevel,
    sampleFlowCm3PerMin: flow,
    wholeTestAmbient: { start: wholeStart, end: wholeEnd },
    intervals
  })
  for (const s of simulated) {
    s.fitFactor = result.exercises.find(e => e.exerciseKey === s.exerciseKey)?.fitFactor ?? null
  }
  const trueOverall = harmonicMeanFitFactor(trueValues)
  return {
    exercises: simulated,
    overall: result.overall,
    trueOverall,
    pass: result.ok && result.pass,
    truePass: meetsPassLevel(trueOverall, input.passLevel),
    result
  }
}

// One simulated test, reproducible from its seed.
export function simulateFitTest(input: SimulationInput): SimulatedTest {
  validate(input)
  const { result: _result, ...test } = simulateOnce(input, mulberry32(input.seed))
  return test
}

// One simulated test with the full result a real test gets (intervals included), so the lab
// shows it with the same components as a recorded result.
export function simulateFitTestResult(input: SimulationInput): SimulatedTest & { result: FitTestResult } {
  validate(input)
  return simulateOnce(input, mulberry32(input.seed), true)
}

export interface SimulationSummary {
  runs: number
  passCount: number
  passProbability: number
  // runs in which some in-mask count was zero, so the overall is only a lower bound
  lowerBoundRuns: number
  trueOverall: number
  truePass: boolean
  // percentiles of the simulated overall fit factor
  percentiles: { p5: number, p25: number, p50: number, p75: number, p95: number }
  // runs per bin of equal width in log10(overall), for a distribution chart
  histogram: LogHistogram
}

export interface LogHistogram {
  // lower edge of each bin, fit factor; the last bin ends at `upperEdge`
  lowerEdges: number[]
  upperEdge: number
  counts: number[]
}

// Bins of equal width on a log scale from the smallest to the largest value (at least a factor
// of 1.5 wide so a narrow distribution still shows as a peak, not one bar).
export function logHistogram(sortedValues: ArrayLike<number>, bins = 40): LogHistogram {
  const positive: number[] = []
  for (let i = 0; i < sortedValues.length; i++) if (sortedValues[i]! > 0) positive.push(sortedValues[i]!)
  if (positive.length === 0) return { lowerEdges: [], upperEdge: 0, counts: [] }
  let lo = Math.log10(positive[0]!)
  let hi = Math.log10(positive[positive.length - 1]!)
  if (hi - lo < Math.log10(1.5)) {
    const mid = (hi + lo) / 2
    lo = mid - Math.log10(1.5) / 2
    hi = mid + Math.log10(1.5) / 2
  }
  const width = (hi - lo) / bins
  const counts = Array.from({ length: bins }, () => 0)
  for (const v of positive) {
    const b = Math.min(bins - 1, Math.max(0, Math.floor((Math.log10(v) - lo) / width)))
    counts[b]!++
  }
  return { lowerEdges: counts.map((_, i) => 10 ** (lo + i * width)), upperEdge: 10 ** hi, counts }
}

// The bulk path of the simulator: the same draws in the same order as simulateOnce and the same
// formulas as computeFitTest (mean ambient, ambient ÷ in-mask, the zero-count lower bound, the
// harmonic mean, ≥ the level), without building a full result per run. A unit test holds it to
// computeFitTest run by run.
export function fastRunner(input: SimulationInput): ((random: RandomSource) => { overall: number | null, isLowerBound: boolean, pass: boolean }) & { trueOverall: number } {
  const { protocol, ambient, passLevel } = input
  const flow = input.sampleFlowCm3PerMin
  const timeline = protocolTimeline(protocol)
  const plan = protocol.ambientPlan
  const ambientPhases = timeline.ambientPhases
  const phaseIndex = new Map(ambientPhases.map((ph, i) => [ph, i]))
  const steps = timeline.exercises.filter(w => w.counted && w.mask).map((w) => {
    const maskSeconds = w.mask!.endSeconds - w.mask!.startSeconds
    const trueFitFactor = trueFactorFor(input, w.exerciseKey)
    const volume = sampleVolumeCm3(flow, maskSeconds)
    const ambientOf = (ph: PhaseWindow | null) => ({ index: ph ? phaseIndex.get(ph)! : -1, volume: sampleVolumeCm3(flow, ph ? ph.endSeconds - ph.startSeconds : maskSeconds) })
    return { trueFitFactor, volume, expected: ambient * volume / trueFitFactor, before: ambientOf(w.ambientBefore), after: ambientOf(w.ambientAfter) }
  })
  const measured = new Float64Array(ambientPhases.length)
  const known = new Uint8Array(ambientPhases.length)
  const ffs = new Array<number>(steps.length)
  const runner = (random: RandomSource) => {
    known.fill(0)
    const measure = (a: { index: number, volume: number }) => {
      if (a.index >= 0 && known[a.index]) return measured[a.index]!
      const value = samplePoisson(ambient * a.volume, random) / a.volume
      if (a.index >= 0) {
        measured[a.index] = value
        known[a.index] = 1
      }
      return value
    }
    const counts = new Array<number>(steps.length)
    const ambients = new Array<number>(steps.length)
    let wholeStart = 0
    let wholeEnd = 0
    steps.forEach((st, i) => {
      counts[i] = samplePoisson(st.expected, random)
      if (plan === 'per-exercise') ambients[i] = meanAmbient(measure(st.before), measure(st.after))
      else if (plan === 'continuous') ambients[i] = measure({ index: -1, volume: st.volume })
      else {
        wholeStart = measure(st.before)
        wholeEnd = measure(st.after)
      }
    })
    let isLowerBound = false
    for (let i = 0; i < steps.length; i++) {
      const a = plan === 'whole-test' ? meanAmbient(wholeStart, wholeEnd) : ambients[i]!
      // an ambient sample that counted nothing gives no fit factor: the test has no result
      if (!(a > 0)) return { overall: null, isLowerBound: false, pass: false }
      if (counts[i] === 0) {
        ffs[i] = zeroCountFitFactorBound(a, steps[i]!.volume).value
        isLowerBound = true
      } else {
        ffs[i] = exerciseFitFactor(a, counts[i]! / steps[i]!.volume)
      }
    }
    const overall = harmonicMeanFitFactor(ffs)
    return { overall, isLowerBound, pass: meetsPassLevel(overall, passLevel) }
  }
  return Object.assign(runner, { trueOverall: harmonicMeanFitFactor(steps.map(st => st.trueFitFactor)) })
}

// K simulated tests from one seeded generator, summarized for the training lab.
export function simulateFitTests(input: SimulationInput & { runs: number }): SimulationSummary {
  validate(input)
  if (!Number.isInteger(input.runs) || input.runs < 1) throw new RangeError('runs must be a whole number ≥ 1')
  const random = mulberry32(input.seed)
  const overalls = new Float64Array(input.runs)
  let passCount = 0
  let lowerBoundRuns = 0
  const runOnce = fastRunner(input)
  for (let i = 0; i < input.runs; i++) {
    const run = runOnce(random)
    overalls[i] = run.overall ?? 0
    if (run.pass) passCount++
    if (run.isLowerBound) lowerBoundRuns++
  }
  const trueOverall = runOnce.trueOverall
  const truePass = meetsPassLevel(trueOverall, input.passLevel)
  overalls.sort()
  const sorted = Array.from(overalls)
  return {
    runs: input.runs,
    passCount,
    passProbability: passCount / input.runs,
    lowerBoundRuns,
    trueOverall,
    truePass,
    percentiles: {
      p5: quantileSorted(sorted, 0.05),
      p25: quantileSorted(sorted, 0.25),
      p50: quantileSorted(sorted, 0.5),
      p75: quantileSorted(sorted, 0.75),
      p95: quantileSorted(sorted, 0.95)
    },
    histogram: logHistogram(overalls)
  }
}

export type { RandomSource, SimulationInput, SimulatedExercise, SimulatedTest } from './simulation-core'
export { mulberry32, samplePoisson } from './simulation-core'
export type { PassProbabilityMethod, PassProbabilityInput, PassProbability, OperatingCharacteristicInput, OperatingCharacteristicPoint, OperatingCharacteristic } from './pass-probability'
export { PASS_PROBABILITY_METHOD_LABELS, DEFAULT_MONTE_CARLO_RUNS, poissonCdf, passProbability, scaleProfile, operatingCharacteristic } from './pass-probability'
export type { TraceSecond, SimulatedTrace } from './simulation-trace'
export { simulateCountTrace } from './simulation-trace'
