import { quantileSorted } from 'simple-statistics'
import { sampleVolumeCm3 } from './counting-stats'
import type { FitFactorValue } from './fit-factor'
import { exerciseFitFactor, harmonicMeanFitFactor, meanAmbient, meetsPassLevel, zeroCountFitFactorBound } from './fit-factor'
import type { ExerciseInput, FitTestResult } from './fit-test'
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

// ── Probability of passing (the operating characteristic) ────────────────────────────────────
//
// Model: ambient is taken as precise (its count is hundreds of times the in-mask count) and the
// in-mask count of counted exercise i is Poisson with mean λᵢ = C·Vᵢ / FFᵢ (Vᵢ = Q·tᵢ, derived
// from N = C·Q·t). The measured fit factor is C·Vᵢ / Nᵢ, or the lower bound C·Vᵢ / 2.9957 when
// Nᵢ = 0 (one-sided Poisson, Garwood 1936), so the measured overall (the harmonic mean,
// 29 CFR 1910.134 App. A Part I.C.2(c)) is n·C / Σ(N′ᵢ/Vᵢ) with N′ = N, or 2.9957 for a zero.
// A test passes when that overall ≥ the pass level L (29 CFR 1910.134(f)(7)), that is when
// Σ(N′ᵢ/Vᵢ) ≤ n·C / L.
//
// • every counted exercise samples the same seconds and each expects ≥ 30 counts (a zero is
//   then rarer than 1 in 10¹³): ΣNᵢ is Poisson(Σλᵢ) and P(pass) = P(ΣN ≤ ⌊n·C·V / L⌋), exact;
// • otherwise, when each exercise expects ≥ 20 counts (a zero then has odds below 1 in 10⁸) and
//   the skewness of Σ(Nᵢ/Vᵢ), (Σλᵢ/Vᵢ³) / (Σλᵢ/Vᵢ²)^1.5, is below 0.05: the sum is close to normal
//   with mean Σλᵢ/Vᵢ and variance Σλᵢ/Vᵢ² (normal approximation, labelled so; the first
//   Edgeworth correction, skewness/6·|z²−1|·φ(z), is then below 0.004);
// • otherwise, far from the level: Cantelli's one-sided inequality bounds the chance of the other
//   outcome by σ²/(σ² + d²), d the distance from the mean of Σ(Nᵢ/Vᵢ) to the threshold (less the
//   most zeros can add, Σ 2.9957/Vᵢ, on the passing side); when that is ≤ 0.1 % the bound is given;
// • otherwise a seeded Monte Carlo of the same model.

export type PassProbabilityMethod = 'exact' | 'normal-approximation' | 'bound' | 'monte-carlo'

export const PASS_PROBABILITY_METHOD_LABELS: Record<PassProbabilityMethod, string> = {
  'exact': 'exact (Poisson sum)',
  'normal-approximation': 'normal approximation (every exercise expects 20 or more counts, skewness below 0.05)',
  'bound': 'within 0.1 % of certain (Cantelli\'s inequality)',
  'monte-carlo': 'Monte Carlo (seeded)'
}

export interface PassProbabilityInput {
  protocol: Protocol
  trueFitFactors: number | Readonly<Record<string, number>>
  ambient: number
  sampleFlowCm3PerMin: number
  passLevel: number
  // seed and runs of the Monte Carlo, when it is needed
  seed?: number
  runs?: number
}

export interface PassProbability {
  probability: number
  method: PassProbabilityMethod
  // Monte Carlo runs behind the figure; null when worked out
  runs: number | null
  trueOverall: number
  // the smallest expected in-mask count of any counted exercise
  smallestExpectedCount: number
}

// one-sided 95 % upper bound of a zero count, −ln 0.05 (Garwood 1936): what a zero counts as
const ZERO_COUNT_BOUND = -Math.log(0.05)
const EXACT_MIN_EXPECTED = 30
const NORMAL_MIN_EXPECTED = 20
const NORMAL_MAX_SKEWNESS = 0.05
const BOUND_TOLERANCE = 0.001
export const DEFAULT_MONTE_CARLO_RUNS = 4000

interface CountedExercise { volume: number, lambda: number }

function countedExercises(input: PassProbabilityInput): { exercises: CountedExercise[], trueOverall: number } {
  validate({ ...input, seed: input.seed ?? 1 })
  const exercises: CountedExercise[] = []
  const truth: number[] = []
  for (const e of input.protocol.exercises) {
    if (!e.counted || !(e.sampling.maskSeconds > 0)) continue
    const ff = trueFactorFor({ ...input, seed: 0 }, e.key)
    const volume = sampleVolumeCm3(input.sampleFlowCm3PerMin, e.sampling.maskSeconds)
    exercises.push({ volume, lambda: input.ambient * volume / ff })
    truth.push(ff)
  }
  if (exercises.length === 0) throw new RangeError('the protocol has no counted exercise with an in-mask sample')
  return { exercises, trueOverall: harmonicMeanFitFactor(truth) }
}

// ln Γ(x) by the Lanczos approximation (g = 7, 9 terms; constants from memory, relative error
// below 1e-13), for the Poisson tail below.
const LANCZOS = [0.99999999999980993, 676.5203681218851, -1259.1392167224028, 771.32342877765313,
  -176.61502916214059, 12.507343278686905, -0.13857109526572012, 9.9843695780195716e-6, 1.5056327351493116e-7]
function logGamma(x: number): number {
  const xm = x - 1
  let a = LANCZOS[0]!
  const t = xm + 7.5
  for (let i = 1; i < 9; i++) a += LANCZOS[i]! / (xm + i)
  return 0.5 * Math.log(2 * Math.PI) + (xm + 0.5) * Math.log(t) - t + Math.log(a)
}

// Regularized lower incomplete gamma P(a, x): series below a + 1, continued fraction (Lentz)
// above — the standard pair of expansions (Numerical Recipes §6.2, from memory).
function regularizedGammaP(a: number, x: number): number {
  if (x <= 0) return 0
  const logPrefix = a * Math.log(x) - x - logGamma(a)
  if (x < a + 1) {
    let term = 1 / a
    let sum = term
    for (let n = 1; n < 100000; n++) {
      term *= x / (a + n)
      sum += term
      if (Math.abs(term) < Math.abs(sum) * 1e-15) break
    }
    return Math.min(1, sum * Math.exp(logPrefix))
  }
  const tiny = 1e-300
  let b = x + 1 - a
  let c = 1 / tiny
  let d = 1 / b
  let h = d
  for (let i = 1; i < 100000; i++) {
    const an = -i * (i - a)
    b += 2
    d = an * d + b
    if (Math.abs(d) < tiny) d = tiny
    c = b + an / c
    if (Math.abs(c) < tiny) c = tiny
    d = 1 / d
    const delta = d * c
    h *= delta
    if (Math.abs(delta - 1) < 1e-15) break
  }
  return Math.max(0, 1 - Math.exp(logPrefix) * h)
}

// P(N ≤ k) for N Poisson with mean λ: 1 − P(k + 1, λ) (the Poisson–gamma relation).
export function poissonCdf(k: number, mean: number): number {
  if (!(mean >= 0) || !Number.isFinite(mean)) throw new RangeError('mean must be a finite number ≥ 0')
  if (k < 0) return 0
  if (mean === 0) return 1
  return 1 - regularizedGammaP(Math.floor(k) + 1, mean)
}

// Standard normal CDF via erfc (Numerical Recipes' Chebyshev erfc, from memory; |error| < 1.2e-7).
function normalCdf(z: number): number {
  const x = Math.abs(z) / Math.SQRT2
  const t = 1 / (1 + 0.5 * x)
  const erfc = t * Math.exp(-x * x - 1.26551223 + t * (1.00002368 + t * (0.37409196 + t * (0.09678418
    + t * (-0.18628806 + t * (0.27886807 + t * (-1.13520398 + t * (1.48851413
      + t * (-0.82215223 + t * 0.17087277)))))))))
  return z >= 0 ? 1 - erfc / 2 : erfc / 2
}

// Tolerance of meetsPassLevel: a ratio that equals the level up to rounding counts as meeting it.
const LEVEL_TOLERANCE = 1e-12

function monteCarloPassProbability(exercises: CountedExercise[], threshold: number, runs: number, random: RandomSource): number {
  let passes = 0
  const limit = threshold * (1 + LEVEL_TOLERANCE)
  for (let r = 0; r < runs; r++) {
    let s = 0
    for (const e of exercises) {
      const n = samplePoisson(e.lambda, random)
      s += (n === 0 ? ZERO_COUNT_BOUND : n) / e.volume
      if (s > limit) break
    }
    if (s <= limit) passes++
  }
  return passes / runs
}

// Probability that one test of a wearer with these true fit factors passes, from counting noise
// alone (see the model above). The method used is returned with the figure.
export function passProbability(input: PassProbabilityInput): PassProbability {
  const { exercises, trueOverall } = countedExercises(input)
  const n = exercises.length
  // pass ⇔ Σ(N′ᵢ/Vᵢ) ≤ n·C / L
  const threshold = n * input.ambient / input.passLevel
  const smallestExpectedCount = Math.min(...exercises.map(e => e.lambda))
  const base = { trueOverall, smallestExpectedCount }
  const sameVolume = exercises.every(e => Math.abs(e.volume - exercises[0]!.volume) <= 1e-9 * e.volume)
  if (sameVolume && smallestExpectedCount >= EXACT_MIN_EXPECTED) {
    const volume = exercises[0]!.volume
    const total = exercises.reduce((a, e) => a + e.lambda, 0)
    const k = Math.floor(threshold * volume * (1 + LEVEL_TOLERANCE))
    return { ...base, probability: poissonCdf(k, total), method: 'exact', runs: null }
  }
  if (smallestExpectedCount >= NORMAL_MIN_EXPECTED) {
    let mean = 0
    let variance = 0
    let thirdCumulant = 0
    for (const e of exercises) {
      mean += e.lambda / e.volume
      variance += e.lambda / e.volume ** 2
      thirdCumulant += e.lambda / e.volume ** 3
    }
    if (thirdCumulant / variance ** 1.5 < NORMAL_MAX_SKEWNESS) {
      return { ...base, probability: normalCdf((threshold - mean) / Math.sqrt(variance)), method: 'normal-approximation', runs: null }
    }
  }
  let mean = 0
  let variance = 0
  let zeroShift = 0
  for (const e of exercises) {
    mean += e.lambda / e.volume
    variance += e.lambda / e.volume ** 2
    zeroShift += ZERO_COUNT_BOUND / e.volume
  }
  const passSide = threshold - zeroShift - mean
  const failSide = mean - threshold
  const cantelli = (d: number) => variance / (variance + d * d)
  if (passSide > 0 && cantelli(passSide) <= BOUND_TOLERANCE) return { ...base, probability: 1 - cantelli(passSide), method: 'bound', runs: null }
  if (failSide > 0 && cantelli(failSide) <= BOUND_TOLERANCE) return { ...base, probability: cantelli(failSide), method: 'bound', runs: null }
  const runs = input.runs ?? DEFAULT_MONTE_CARLO_RUNS
  if (!Number.isInteger(runs) || runs < 1) throw new RangeError('runs must be a whole number ≥ 1')
  const probability = monteCarloPassProbability(exercises, threshold, runs, mulberry32(input.seed ?? 1))
  return { ...base, probability, method: 'monte-carlo', runs }
}

export interface OperatingCharacteristicInput extends Omit<PassProbabilityInput, 'trueFitFactors'> {
  // the wearer's pattern of leaks: true fit factors whose harmonic mean is scaled to each point
  profile: number | Readonly<Record<string, number>>
  // true overall fit factors to evaluate, spaced evenly on a log scale
  fromFitFactor: number
  toFitFactor: number
  points: number
}

export type OperatingCharacteristicPoint = PassProbability

export interface OperatingCharacteristic {
  points: OperatingCharacteristicPoint[]
  passLevel: number
  // true overall fit factors at which the probability of passing first reaches 5 %, 50 % and 95 %
  // (linear between points on the log scale); null outside the range drawn
  at5: number | null
  at50: number | null
  at95: number | null
}

// Scales every exercise of a leak pattern by the same factor so that the harmonic mean is `overall`.
export function scaleProfile(protocol: Protocol, profile: number | Readonly<Record<string, number>>, overall: number): Record<string, number> {
  const counted = protocol.exercises.filter(e => e.counted)
  const values = counted.map(e => typeof profile === 'number' ? profile : profile[e.key] ?? Number.NaN)
  if (values.some(v => !(v > 0) || !Number.isFinite(v))) throw new RangeError('every counted exercise needs a positive true fit factor')
  const k = overall / harmonicMeanFitFactor(values)
  return Object.fromEntries(counted.map((e, i) => [e.key, values[i]! * k]))
}

function crossing(points: OperatingCharacteristicPoint[], p: number): number | null {
  for (let i = 1; i < points.length; i++) {
    const a = points[i - 1]!
    const b = points[i]!
    if (a.probability < p && b.probability >= p) {
      const f = (p - a.probability) / (b.probability - a.probability)
      return 10 ** (Math.log10(a.trueOverall) + f * (Math.log10(b.trueOverall) - Math.log10(a.trueOverall)))
    }
  }
  return null
}

// Probability of passing against the true overall fit factor: how sharply a test separates a
// wearer just above the level from one just below, at this concentration, flow and protocol.
export function operatingCharacteristic(input: OperatingCharacteristicInput): OperatingCharacteristic {
  const { fromFitFactor: lo, toFitFactor: hi, points: count } = input
  if (!(lo > 0) || !(hi > lo) || !Number.isFinite(hi)) throw new RangeError('the fit-factor range must be positive and increasing')
  if (!Number.isInteger(count) || count < 2 || count > 400) throw new RangeError('points must be a whole number from 2 to 400')
  let seedStep = 0
  const at = (overall: number) => {
    const trueFitFactors = scaleProfile(input.protocol, input.profile, overall)
    // one seed per point, derived from the input seed, so the curve is reproducible
    return passProbability({ ...input, trueFitFactors, seed: ((input.seed ?? 1) + ++seedStep * 7919) >>> 0 })
  }
  const grid = (a: number, b: number, n: number) => Array.from({ length: n }, (_, i) => 10 ** (Math.log10(a) + i * (Math.log10(b) - Math.log10(a)) / (n - 1)))
  const points = grid(lo, hi, count).map(at)
  // A sharp rise can fall between two grid points: draw the rise itself as finely again.
  const first = points.findIndex(p => p.probability > 0.001)
  const last = points.findIndex(p => p.probability > 0.999)
  if (first > 0 && last > first) {
    const from = points[first - 1]!.trueOverall
    const to = points[Math.min(points.length - 1, last)]!.trueOverall
    points.push(...grid(from, to, count).slice(1, -1).map(at))
    points.sort((a, b) => a.trueOverall - b.trueOverall)
  }
  return { points, passLevel: input.passLevel, at5: crossing(points, 0.05), at50: crossing(points, 0.5), at95: crossing(points, 0.95) }
}

// ── A second-by-second trace, for watching one simulated test run ─────────────────────────────

export interface TraceSecond {
  t: number
  exerciseIndex: number
  phase: 'purge' | 'ambient' | 'mask' | 'idle'
  // particles counted in this second (null while purging or idle: nothing is sampled)
  count: number | null
  // count ÷ the volume sampled in the second, particles/cm³
  concentration: number | null
}

export interface SimulatedTrace {
  seconds: TraceSecond[]
  result: FitTestResult
  trueOverall: number
  // each exercise's fit factor can be shown once the trace passes this second
  exerciseReadyAt: Record<string, number>
}

// One simulated test second by second: every sampled second is a Poisson count, and the
// exercise inputs are the sums of those seconds, so the result is exactly what the trace shows.
// The result goes through computeFitTest like a recorded test.
export function simulateCountTrace(input: SimulationInput): SimulatedTrace {
  validate(input)
  const { protocol } = input
  const random = mulberry32(input.seed)
  const timeline = protocolTimeline(protocol)
  const perSecondVolume = sampleVolumeCm3(input.sampleFlowCm3PerMin, 1)
  const seconds: TraceSecond[] = []
  const phaseCounts = new Map<PhaseWindow, number>()
  const truth: number[] = []
  for (const w of timeline.exercises) {
    const trueFitFactor = w.counted && w.mask ? trueFactorFor(input, w.exerciseKey) : null
    if (trueFitFactor !== null) truth.push(trueFitFactor)
    for (const ph of w.phases) {
      let total = 0
      for (let t = ph.startSeconds; t < ph.endSeconds; t++) {
        let count: number | null = null
        if (ph.kind === 'ambient') count = samplePoisson(input.ambient * perSecondVolume, random)
        // an exercise that is not counted is performed without a sample
        if (ph.kind === 'mask' && trueFitFactor !== null) count = samplePoisson(input.ambient * perSecondVolume / trueFitFactor, random)
        if (count !== null) total += count
        seconds.push({ t, exerciseIndex: w.index, phase: ph.kind, count, concentration: count === null ? null : count / perSecondVolume })
      }
      phaseCounts.set(ph, total)
    }
  }
  const concentrationOf = (ph: PhaseWindow | null) => ph ? phaseCounts.get(ph)! / sampleVolumeCm3(input.sampleFlowCm3PerMin, ph.endSeconds - ph.startSeconds) : null
  const exercises: ExerciseInput[] = []
  const exerciseReadyAt: Record<string, number> = {}
  let wholeStart: number | null = null
  let wholeEnd: number | null = null
  for (const w of timeline.exercises) {
    if (!w.counted || !w.mask) continue
    const entry: ExerciseInput = { exerciseKey: w.exerciseKey, inMaskCount: phaseCounts.get(w.mask)!, inMaskSeconds: w.mask.endSeconds - w.mask.startSeconds }
    if (protocol.ambientPlan === 'per-exercise') {
      entry.ambientBefore = concentrationOf(w.ambientBefore)
      entry.ambientAfter = concentrationOf(w.ambientAfter)
    } else if (protocol.ambientPlan === 'continuous') {
      entry.ambientMean = input.ambient
    } else {
      wholeStart = concentrationOf(w.ambientBefore)
      wholeEnd = concentrationOf(w.ambientAfter)
    }
    exercises.push(entry)
    exerciseReadyAt[w.exerciseKey] = protocol.ambientPlan === 'per-exercise'
      ? (w.ambientAfter?.endSeconds ?? w.mask.endSeconds)
      : protocol.ambientPlan === 'whole-test' ? timeline.durationSeconds : w.mask.endSeconds
  }
  const result = computeFitTest({
    protocol,
    exercises,
    wholeTestAmbient: { start: wholeStart, end: wholeEnd },
    passLevel: input.passLevel,
    sampleFlowCm3PerMin: input.sampleFlowCm3PerMin
  })
  return { seconds, result, trueOverall: harmonicMeanFitFactor(truth), exerciseReadyAt }
}
