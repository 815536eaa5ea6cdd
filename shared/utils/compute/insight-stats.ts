import jStat from 'jstat'
import { median } from 'simple-statistics'

// Statistics for insights that simple-statistics lacks: a robust trend (Theil–Sen) and binomial
// funnel limits for comparing testers. Wilson intervals and geometric summaries are in summaries.ts.

export interface TrendPoint {
  /** Time in years (any origin). */
  t: number
  /** ln(overall fit factor). */
  y: number
}

export interface TheilSenFit {
  /** Median of the pairwise slopes (Sen 1968), in ln units per year. */
  slope: number
  /** Median of yᵢ − slope·tᵢ (Conover's choice of intercept, from memory). */
  intercept: number
  points: number
}

/**
 * Theil–Sen slope: the median of (yⱼ − yᵢ)/(tⱼ − tᵢ) over every pair with tⱼ ≠ tᵢ — Sen (1968),
 * "Estimates of the regression coefficient based on Kendall's tau", JASA 63:1379 (from memory).
 * Null when fewer than two distinct times exist.
 */
export function theilSen(points: readonly TrendPoint[]): TheilSenFit | null {
  const slopes: number[] = []
  for (let i = 0; i < points.length; i++) {
    for (let j = i + 1; j < points.length; j++) {
      const a = points[i]!
      const b = points[j]!
      if (b.t !== a.t) slopes.push((b.y - a.y) / (b.t - a.t))
    }
  }
  if (slopes.length === 0) return null
  const slope = median(slopes)
  const intercept = median(points.map(p => p.y - slope * p.t))
  return { slope, intercept, points: points.length }
}

export interface DriftInput {
  /** Tests of one person on one respirator model: time in years, overall fit factor. */
  tests: readonly { t: number, fitFactor: number }[]
  passLevel: number
  /** When the next test is due, in the same years as `t`. */
  nextDueT: number
  /** Flag when the latest result is below this fraction of the person's own median (e.g. 0.5). */
  dropFraction: number
}

export interface DriftAssessment {
  fit: TheilSenFit | null
  medianFitFactor: number
  latestFitFactor: number
  /** The trend's fit factor at the next due date; null without a trend. */
  predictedAtDue: number | null
  latestBelowOwnMedian: boolean
  predictsFailBeforeDue: boolean
  flagged: boolean
}

/**
 * Whose fit is drifting: flagged when the latest result falls below `dropFraction` of the
 * person's own median, or when the Theil–Sen line of ln(FF) predicts a value below the pass level
 * by the next due date (common practice (no published source): a robust trend on the log scale,
 * because fit factors are roughly log-normal). Needs three tests.
 */
export function assessDrift(input: DriftInput): DriftAssessment | null {
  if (input.tests.length < 3) return null
  const sorted = [...input.tests].sort((a, b) => a.t - b.t)
  const fit = theilSen(sorted.map(p => ({ t: p.t, y: Math.log(p.fitFactor) })))
  const medianFitFactor = Math.exp(median(sorted.map(p => Math.log(p.fitFactor))))
  const latestFitFactor = sorted[sorted.length - 1]!.fitFactor
  const predictedAtDue = fit ? Math.exp(fit.intercept + fit.slope * input.nextDueT) : null
  const latestBelowOwnMedian = latestFitFactor < input.dropFraction * medianFitFactor
  const predictsFailBeforeDue = fit !== null && fit.slope < 0 && predictedAtDue !== null && predictedAtDue < input.passLevel
  return {
    fit,
    medianFitFactor,
    latestFitFactor,
    predictedAtDue,
    latestBelowOwnMedian,
    predictsFailBeforeDue,
    flagged: latestBelowOwnMedian || predictsFailBeforeDue
  }
}

/** P(X ≤ k) for X ~ Binomial(n, p), via the regularized incomplete beta I_{1−p}(n−k, k+1). */
export function binomialCdf(k: number, n: number, p: number): number {
  if (k < 0) return 0
  if (k >= n) return 1
  if (p <= 0) return 1
  if (p >= 1) return 0
  return jStat.ibeta(1 - p, n - k, k + 1)
}

/** Smallest r with P(X ≤ r) ≥ q. */
function binomialQuantile(q: number, n: number, p: number): number {
  let lo = 0
  let hi = n
  while (lo < hi) {
    const mid = Math.floor((lo + hi) / 2)
    if (binomialCdf(mid, n, p) >= q) hi = mid
    else lo = mid + 1
  }
  return lo
}

/**
 * Control limit for an observed proportion out of n when the true rate is p: the q-quantile of
 * Binomial(n, p), interpolated so the limit moves smoothly with n — Spiegelhalter (2005), "Funnel
 * plots for comparing institutional performance", Stat Med 24:1185, appendix (from memory):
 * r = quantile, α = (F(r) − q) / (F(r) − F(r − 1)), limit = (r − α) / n.
 */
export function binomialFunnelLimit(q: number, n: number, p: number): number {
  if (!Number.isInteger(n) || n < 1) throw new RangeError('n must be a whole number ≥ 1')
  if (!(p >= 0 && p <= 1)) throw new RangeError('p must be between 0 and 1')
  if (!(q > 0 && q < 1)) throw new RangeError('q must be between 0 and 1')
  const r = binomialQuantile(q, n, p)
  const fr = binomialCdf(r, n, p)
  const frMinus = binomialCdf(r - 1, n, p)
  const alpha = fr > frMinus ? (fr - q) / (fr - frMinus) : 0
  return Math.min(1, Math.max(0, (r - alpha) / n))
}

export interface FunnelLimits {
  n: number
  /** 95 % limits (2.5 % and 97.5 % quantiles). */
  lower95: number
  upper95: number
  /** 99.8 % limits (0.1 % and 99.9 % quantiles). */
  lower998: number
  upper998: number
}

export function binomialFunnelLimits(n: number, p: number): FunnelLimits {
  return {
    n,
    lower95: binomialFunnelLimit(0.025, n, p),
    upper95: binomialFunnelLimit(0.975, n, p),
    lower998: binomialFunnelLimit(0.001, n, p),
    upper998: binomialFunnelLimit(0.999, n, p)
  }
}

export type FunnelPosition = 'below-998' | 'below-95' | 'within' | 'above-95' | 'above-998'

/** Where an observed rate sits against the funnel (strictly outside a limit counts as outside). */
export function funnelPosition(rate: number, limits: FunnelLimits): FunnelPosition {
  if (rate < limits.lower998) return 'below-998'
  if (rate < limits.lower95) return 'below-95'
  if (rate > limits.upper998) return 'above-998'
  if (rate > limits.upper95) return 'above-95'
  return 'within'
}
