import { quantileSorted } from 'simple-statistics'
import { sampleVolumeCm3 } from './counting-stats'
import type { FitFactorValue } from './fit-factor'
import { harmonicMeanFitFactor, meetsPassLevel } from './fit-factor'
import type { ExerciseInput } from './fit-test'
import { computeFitTest } from './fit-test'
import type { PhaseWindow, Protocol } from './protocols'
import { protocolTimeline } from './protocols'

// Training-lab simulator: what the counter would count, exercise by exercise, if the true fit
// factors and ambient concentration were known. Only counting noise is simulated (Poisson);
// real tests add the wearer's movement and ambient drift on top.

export type RandomSource = () => number

// mulberry32: a small, fast, public-domain 32-bit seeded generator (constants from memory);
// uniform in [0, 1). Good enough for teaching, not for cryptography.
export function mulberry32(seed: number): RandomSource {
  let a = seed >>> 0
  return () => {
    a = (a + 0x6D2B79F5) >>> 0
    let t = a
    t = Math.imul(t ^ (t >>> 15), t | 1)
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61)
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296
  }
}

const LOG_FACTORIAL_TABLE = [0, 0, 0.6931471805599453, 1.791759469228055, 3.1780538303479458,
  4.787491742782046, 6.579251212010101, 8.525161361065415, 10.60460290274525, 12.801827480081469]

// ln(k!) — table below 10, Stirling series above (error below 1e-10 there).
function logFactorial(k: number): number {
  if (k < 10) return LOG_FACTORIAL_TABLE[k]!
  const x = k + 1
  return (x - 0.5) * Math.log(x) - x + 0.5 * Math.log(2 * Math.PI)
    + 1 / (12 * x) - 1 / (360 * x ** 3) + 1 / (1260 * x ** 5)
}

// Poisson variate with mean `mean`. Below 10: inversion by sequential search. From 10 up:
// the transformed rejection method PTRS (Hörmann 1993, "The transformed rejection method for
// generating Poisson random variables"; constants from memory), exact and fast for any mean.
export function samplePoisson(mean: number, random: RandomSource): number {
  if (!(mean >= 0) || !Number.isFinite(mean)) throw new RangeError('mean must be a finite number ≥ 0')
  if (mean === 0) return 0
  if (mean < 10) {
    let k = 0
    let p = Math.exp(-mean)
    let cumulative = p
    const u = random()
    while (u > cumulative && k < 1000) {
      k++
      p *= mean / k
      cumulative += p
    }
    return k
  }
  const sqrtMean = Math.sqrt(mean)
  const logMean = Math.log(mean)
  const b = 0.931 + 2.53 * sqrtMean
  const a = -0.059 + 0.02483 * b
  const invAlpha = 1.1239 + 1.1328 / (b - 3.4)
  const vr = 0.9277 - 3.6224 / (b - 2)
  for (;;) {
    const u = random() - 0.5
    const v = random()
    const us = 0.5 - Math.abs(u)
    const k = Math.floor((2 * a / us + b) * u + mean + 0.43)
    if (us >= 0.07 && v <= vr) return k
    if (k < 0 || (us < 0.013 && v > us)) continue
    if (Math.log(v) + Math.log(invAlpha) - Math.log(a / (us * us) + b) <= -mean + k * logMean - logFactorial(k)) return k
  }
}

export interface SimulationInput {
  protocol: Protocol
  // true fit factor of every counted exercise, or one per exercise key
  trueFitFactors: number | Readonly<Record<string, number>>
  // true ambient concentration, particles/cm³
  ambient: number
  sampleFlowCm3PerMin: number
  passLevel: number
  seed: number
}

export interface SimulatedExercise {
  exerciseKey: string
  exerciseName: string
  trueFitFactor: number
  expectedInMaskCount: number
  inMaskCount: number
  fitFactor: FitFactorValue | null
}

export interface SimulatedTest {
  exercises: SimulatedExercise[]
  overall: FitFactorValue | null
  trueOverall: number
  pass: boolean
  truePass: boolean
}

function trueFactorFor(input: SimulationInput, key: string): number {
  const ff = typeof input.trueFitFactors === 'number' ? input.trueFitFactors : input.trueFitFactors[key]
  if (ff === undefined || !(ff > 0) || !Number.isFinite(ff)) {
    throw new RangeError(`a positive true fit factor is needed for exercise '${key}'`)
  }
  return ff
}

function validate(input: SimulationInput): void {
  for (const [name, v] of [['ambient', input.ambient], ['sample flow', input.sampleFlowCm3PerMin], ['pass level', input.passLevel]] as const) {
    if (!(v > 0) || !Number.isFinite(v)) throw new RangeError(`${name} must be a positive number`)
  }
}

function simulateOnce(input: SimulationInput, random: RandomSource): SimulatedTest {
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
    intervals: false
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
    truePass: meetsPassLevel(trueOverall, input.passLevel)
  }
}

// One simulated test, reproducible from its seed.
export function simulateFitTest(input: SimulationInput): SimulatedTest {
  validate(input)
  return simulateOnce(input, mulberry32(input.seed))
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
}

// K simulated tests from one seeded generator, summarized for the training lab.
export function simulateFitTests(input: SimulationInput & { runs: number }): SimulationSummary {
  validate(input)
  if (!Number.isInteger(input.runs) || input.runs < 1) throw new RangeError('runs must be a whole number ≥ 1')
  const random = mulberry32(input.seed)
  const overalls = new Float64Array(input.runs)
  let passCount = 0
  let lowerBoundRuns = 0
  let trueOverall = 0
  let truePass = false
  for (let i = 0; i < input.runs; i++) {
    const run = simulateOnce(input, random)
    overalls[i] = run.overall?.value ?? 0
    if (run.pass) passCount++
    if (run.overall?.isLowerBound) lowerBoundRuns++
    trueOverall = run.trueOverall
    truePass = run.truePass
  }
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
    }
  }
}
