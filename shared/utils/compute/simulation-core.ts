import type { FitFactorValue } from './fit-factor'
import type { Protocol } from './protocols'

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

export function trueFactorFor(input: SimulationInput, key: string): number {
  const ff = typeof input.trueFitFactors === 'number' ? input.trueFitFactors : input.trueFitFactors[key]
  if (ff === undefined || !(ff > 0) || !Number.isFinite(ff)) {
    throw new RangeError(`a positive true fit factor is needed for exercise '${key}'`)
  }
  return ff
}

export function validate(input: SimulationInput): void {
  for (const [name, v] of [['ambient', input.ambient], ['sample flow', input.sampleFlowCm3PerMin], ['pass level', input.passLevel]] as const) {
    if (!(v > 0) || !Number.isFinite(v)) throw new RangeError(`${name} must be a positive number`)
  }
}
