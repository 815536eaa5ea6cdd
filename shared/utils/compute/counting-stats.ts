// The standalone typecheck of index.ts finds jstat's declarations through this reference.
// eslint-disable-next-line @typescript-eslint/triple-slash-reference
/// <reference path="./jstat.d.ts" />
import jStat from 'jstat'

// The counter counts single particles, so a count is Poisson distributed. Everything here is
// about the uncertainty that follows from that alone (not from the aerosol or the wearer).

export const DEFAULT_CONFIDENCE = 0.95

export interface PoissonInterval {
  count: number
  confidence: number
  lower: number
  upper: number
}

function assertConfidence(confidence: number): void {
  if (!(confidence > 0 && confidence < 1)) throw new RangeError('confidence must lie strictly between 0 and 1')
}

function assertCount(count: number): void {
  if (!Number.isFinite(count) || count < 0) throw new RangeError('count must be a finite number ≥ 0')
}

// Small cache: simulations and bulk recomputation ask for the same counts again and again.
const quantileCache = new Map<string, number>()
const QUANTILE_CACHE_LIMIT = 4096

// Chi-square quantile χ²(p; dof), via jstat (jStat.chisquare.inv).
export function chiSquareQuantile(p: number, dof: number): number {
  if (!(p > 0 && p < 1)) throw new RangeError('p must lie strictly between 0 and 1')
  if (!(dof > 0) || !Number.isFinite(dof)) throw new RangeError('degrees of freedom must be positive')
  const key = `${p}|${dof}`
  const cached = quantileCache.get(key)
  if (cached !== undefined) return cached
  const value = jStat.chisquare.inv(p, dof)
  if (quantileCache.size >= QUANTILE_CACHE_LIMIT) quantileCache.clear()
  quantileCache.set(key, value)
  return value
}

// Standard normal quantile, via jstat (simple-statistics' probit is only accurate to ~2 digits).
export function normalQuantile(p: number): number {
  if (!(p > 0 && p < 1)) throw new RangeError('p must lie strictly between 0 and 1')
  return jStat.normal.inv(p, 0, 1)
}

// Wilson–Hilferty cube-root approximation of χ²(p; k) (Wilson & Hilferty 1931, from memory):
// k·(1 − 2/(9k) + z·√(2/(9k)))³ with z the normal quantile of p.
export function chiSquareQuantileWilsonHilferty(p: number, dof: number): number {
  const z = normalQuantile(p)
  const h = 2 / (9 * dof)
  return dof * (1 - h + z * Math.sqrt(h)) ** 3
}

// Above this count the 'fast' method switches from jstat to Wilson–Hilferty. At 2N ≥ 2000
// degrees of freedom its relative error is below 3e-6 (tests/unit/counting-stats.test.ts),
// far inside the interval's own width (±6 % at N = 1000), while jstat's inverse slows down in
// proportion to √N (about 0.5 ms per quantile at N = 100 000 on a 2-core machine).
export const FAST_INTERVAL_EXACT_UP_TO = 1000

export type PoissonIntervalMethod = 'exact' | 'fast'

function quantileFor(p: number, dof: number, method: PoissonIntervalMethod): number {
  return method === 'fast' && dof > 2 * FAST_INTERVAL_EXACT_UP_TO
    ? chiSquareQuantileWilsonHilferty(p, dof)
    : chiSquareQuantile(p, dof)
}

// Exact two-sided interval for a Poisson count N (Garwood 1936):
// lower = ½·χ²(α/2; 2N) (0 when N = 0), upper = ½·χ²(1−α/2; 2N+2).
// A non-integer N (a count estimated as C·V) is accepted; the bounds are continuous in N.
// method 'fast' is exact up to FAST_INTERVAL_EXACT_UP_TO and Wilson–Hilferty above it.
export function poissonInterval(count: number, confidence = DEFAULT_CONFIDENCE, method: PoissonIntervalMethod = 'exact'): PoissonInterval {
  assertCount(count)
  assertConfidence(confidence)
  const alpha = 1 - confidence
  const lower = count === 0 ? 0 : quantileFor(alpha / 2, 2 * count, method) / 2
  const upper = quantileFor(1 - alpha / 2, 2 * count + 2, method) / 2
  return { count, confidence, lower, upper }
}

// One-sided upper bound for a Poisson count: ½·χ²(1−α; 2N+2) (Garwood 1936). For N = 0 it is
// exactly −ln(α): 2.9957 at 95 %.
export function poissonUpperBound(count: number, confidence = DEFAULT_CONFIDENCE): number {
  assertCount(count)
  assertConfidence(confidence)
  if (count === 0) return -Math.log(1 - confidence)
  return chiSquareQuantile(confidence, 2 * count + 2) / 2
}

// Relative standard deviation of a Poisson count: 1/√N. Null for N = 0 (undefined precision).
export function relativeStandardDeviation(count: number): number | null {
  assertCount(count)
  return count === 0 ? null : 1 / Math.sqrt(count)
}

// Sample volume in cm³ from a flow in cm³/min and seconds: V = Q·t with Q in cm³/s.
export function sampleVolumeCm3(flowCm3PerMin: number, seconds: number): number {
  return (flowCm3PerMin / 60) * seconds
}

// Expected count N = C·Q·t (C particles/cm³, Q cm³/s, t s).
export function expectedCount(concentration: number, flowCm3PerMin: number, seconds: number): number {
  return concentration * sampleVolumeCm3(flowCm3PerMin, seconds)
}
