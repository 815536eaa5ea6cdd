import { geometricMean as ssGeometricMean, max, min, quantile, sampleStandardDeviation } from 'simple-statistics'
import { normalQuantile } from './counting-stats'

// Summaries for insights. Fit factors are log-normally spread in practice, so their centre is a
// geometric mean and their spread a geometric standard deviation. Lower-bound fit factors enter
// with their bound (the summaries are then conservative).

function assertPositiveValues(values: readonly number[]): void {
  for (const v of values) {
    if (!(v > 0) || !Number.isFinite(v)) throw new RangeError('fit factors must be positive finite numbers')
  }
}

// Geometric mean (simple-statistics geometricMean).
export function geometricMean(values: readonly number[]): number {
  if (values.length === 0) throw new RangeError('at least one value is needed')
  assertPositiveValues(values)
  return ssGeometricMean([...values])
}

// Geometric standard deviation: exp of the sample standard deviation (n − 1) of ln(values).
// Common practice in industrial hygiene for log-normal data (no published source cited here).
export function geometricStandardDeviation(values: readonly number[]): number {
  if (values.length < 2) throw new RangeError('at least two values are needed')
  assertPositiveValues(values)
  return Math.exp(sampleStandardDeviation(values.map(v => Math.log(v))))
}

export interface RateInterval {
  successes: number
  trials: number
  rate: number
  lower: number
  upper: number
  confidence: number
}

// Wilson score interval for a proportion (Wilson 1927, from memory):
// (p̂ + z²/2n ± z·√(p̂(1−p̂)/n + z²/4n²)) / (1 + z²/n).
export function wilsonInterval(successes: number, trials: number, confidence = 0.95): RateInterval {
  if (!Number.isInteger(trials) || trials < 1) throw new RangeError('trials must be a whole number ≥ 1')
  if (!Number.isInteger(successes) || successes < 0 || successes > trials) throw new RangeError('successes must be a whole number between 0 and trials')
  const z = normalQuantile(1 - (1 - confidence) / 2)
  const n = trials
  const p = successes / n
  const z2 = z * z
  const centre = p + z2 / (2 * n)
  const half = z * Math.sqrt((p * (1 - p)) / n + z2 / (4 * n * n))
  const denominator = 1 + z2 / n
  return {
    successes,
    trials,
    rate: p,
    lower: Math.max(0, (centre - half) / denominator),
    upper: Math.min(1, (centre + half) / denominator),
    confidence
  }
}

// Pass rate of a set of results with its Wilson interval.
export function passRate(passed: readonly boolean[], confidence = 0.95): RateInterval {
  let successes = 0
  for (const p of passed) if (p) successes++
  return wilsonInterval(successes, passed.length, confidence)
}

// Percentiles (0–1) by simple-statistics quantile (its own interpolation rule).
export function percentiles(values: readonly number[], ps: readonly number[] = [0.05, 0.25, 0.5, 0.75, 0.95]): number[] {
  if (values.length === 0) throw new RangeError('at least one value is needed')
  return quantile([...values], [...ps])
}

export interface FitFactorSummary {
  count: number
  geometricMean: number
  geometricStandardDeviation: number | null
  min: number
  max: number
  median: number
  p5: number
  p95: number
}

export function summarizeFitFactors(values: readonly number[]): FitFactorSummary {
  if (values.length === 0) throw new RangeError('at least one value is needed')
  assertPositiveValues(values)
  const [p5, median, p95] = percentiles(values, [0.05, 0.5, 0.95]) as [number, number, number]
  return {
    count: values.length,
    geometricMean: geometricMean(values),
    geometricStandardDeviation: values.length > 1 ? geometricStandardDeviation(values) : null,
    min: min([...values]),
    max: max([...values]),
    median,
    p5,
    p95
  }
}
