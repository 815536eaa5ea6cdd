import { DEFAULT_CONFIDENCE, poissonUpperBound } from './counting-stats'

// A fit factor, or a lower bound on it when the in-mask count was zero. Never Infinity.
export interface FitFactorValue {
  value: number
  isLowerBound: boolean
}

// Exercise fit factor: ambient / in-mask, both particles/cm³.
// 29 CFR 1910.134 App. A, Part I.C.2(c) (from memory).
export function exerciseFitFactor(ambient: number, inMask: number): number {
  return ambient / inMask
}

// Ambient concentration an exercise's fit factor uses, by the protocol's ambient plan:
// the mean of the samples before and after the exercise, the mean of the samples at the start
// and end of the whole test, or the mean of a continuous ambient sample.
// 29 CFR 1910.134 App. A, Part I.C.2(c) (from memory; the three averaging options are listed there).
export function meanAmbient(before: number, after: number): number {
  return (before + after) / 2
}

// Lower bound of a fit factor when no particle was counted in the mask: with zero counts the
// in-mask concentration is below −ln(α)/V at confidence 1−α (one-sided Poisson, Garwood 1936),
// so FF ≥ ambient·V / 2.9957 at 95 %. V = sample volume in cm³.
export function zeroCountFitFactorBound(
  ambient: number,
  sampleVolumeCm3: number,
  confidence = DEFAULT_CONFIDENCE
): FitFactorValue {
  return { value: (ambient * sampleVolumeCm3) / poissonUpperBound(0, confidence), isLowerBound: true }
}

// Overall fit factor: harmonic mean of the counted exercises, n / Σ(1/ffᵢ).
// 29 CFR 1910.134 App. A, Part I.C.2(c) (formula from memory, high confidence).
export function harmonicMeanFitFactor(fitFactors: readonly number[]): number {
  if (fitFactors.length === 0) throw new RangeError('at least one fit factor is needed')
  let reciprocalSum = 0
  for (const ff of fitFactors) {
    if (!(ff > 0) || !Number.isFinite(ff)) throw new RangeError('fit factors must be positive finite numbers')
    reciprocalSum += 1 / ff
  }
  return fitFactors.length / reciprocalSum
}

// The overall of values some of which are lower bounds is itself a lower bound: the harmonic
// mean never falls when an exercise's fit factor rises.
export function overallFitFactor(fitFactors: readonly FitFactorValue[]): FitFactorValue {
  return {
    value: harmonicMeanFitFactor(fitFactors.map(f => f.value)),
    isLowerBound: fitFactors.some(f => f.isLowerBound)
  }
}

// Each exercise's share of the total penetration, (1/ffᵢ) / Σ(1/ff); the shares add up to 1.
// The exercise with the largest share is the one that held the overall down.
// Derived from the harmonic-mean formula above (each term's part of the sum).
export function penetrationShares(fitFactors: readonly number[]): number[] {
  let reciprocalSum = 0
  for (const ff of fitFactors) reciprocalSum += 1 / ff
  return fitFactors.map(ff => 1 / ff / reciprocalSum)
}

// Index of the lowest fit factor (the first one on a tie); -1 for an empty list.
export function limitingIndex(fitFactors: readonly number[]): number {
  let best = -1
  for (let i = 0; i < fitFactors.length; i++) {
    if (best === -1 || fitFactors[i]! < fitFactors[best]!) best = i
  }
  return best
}

// Tolerance for the ≥ comparison: a harmonic mean of seven exercises of exactly 100 may come out
// a few units in the last place below 100 in floating point, and must still pass.
const PASS_RELATIVE_TOLERANCE = 1e-12

// A result passes when overall ≥ level: exactly 100 passes at a level of 100, 99.99 fails.
// 29 CFR 1910.134(f)(7) ("at least" the pass level).
export function meetsPassLevel(fitFactor: number, passLevel: number): boolean {
  return fitFactor >= passLevel || Math.abs(fitFactor - passLevel) <= PASS_RELATIVE_TOLERANCE * passLevel
}

// The text of a fit factor lives in fit-factor-text.ts (no statistics library, so every page may load it).
export { formatFitFactor } from './fit-factor-text'
