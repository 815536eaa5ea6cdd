import { sampleVolumeCm3 } from './counting-stats'
import { harmonicMeanFitFactor } from './fit-factor'
import type { Protocol } from './protocols'
import type { RandomSource } from './simulation-core'
import { mulberry32, samplePoisson, trueFactorFor, validate } from './simulation-core'

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
