import { describe, expect, it } from 'vitest'
import { geometricMean as ssGeometricMean, sampleStandardDeviation } from 'simple-statistics'
import {
  assessDrift,
  binomialCdf,
  binomialFunnelLimit,
  binomialFunnelLimits,
  canonicalMovement,
  funnelPosition,
  geometricMean,
  geometricStandardDeviation,
  EXERCISE_MOVEMENTS,
  MODIFIED_ELASTOMERIC_PROTOCOL,
  MODIFIED_FILTERING_FACEPIECE_PROTOCOL,
  STANDARD_PROTOCOL,
  theilSen,
  wilsonInterval
} from '#shared/utils/compute'

describe('Wilson score interval', () => {
  it.each([
    { passed: 81, total: 263, lower: 0.2553, upper: 0.3662, source: 'Newcombe (1998) Stat Med 17:857, Table I, score method (from memory)' },
    { passed: 15, total: 148, lower: 0.0624, upper: 0.1605, source: 'Newcombe (1998) Stat Med 17:857, Table I, score method (from memory)' },
    { passed: 0, total: 20, lower: 0, upper: 0.1611, source: 'Newcombe (1998) Stat Med 17:857, Table I, score method (from memory)' },
    { passed: 1, total: 29, lower: 0.0061, upper: 0.1718, source: 'Newcombe (1998) Stat Med 17:857, Table I, score method (from memory)' }
  ])('$passed / $total → ($lower, $upper) ($source)', ({ passed, total, lower, upper }) => {
    const r = wilsonInterval(passed, total)
    expect(r.lower).toBeCloseTo(lower, 4)
    expect(r.upper).toBeCloseTo(upper, 4)
  })
})

describe('geometric mean and GSD agree with simple-statistics', () => {
  const values = [37, 180, 412, 950, 2200, 8800]
  it('geometric mean equals simple-statistics geometricMean (derived)', () => {
    expect(geometricMean(values)).toBeCloseTo(ssGeometricMean(values), 9)
  })
  it('GSD equals exp(sampleStandardDeviation(ln x)) (derived from the GSD definition)', () => {
    expect(geometricStandardDeviation(values)).toBeCloseTo(Math.exp(sampleStandardDeviation(values.map(Math.log))), 12)
  })
})

describe('Theil–Sen slope (Sen 1968)', () => {
  it('matches a hand-worked four-point example (derived by hand: slopes −1, 0.5, 1, 4/3, 2, 3)', () => {
    const fit = theilSen([{ t: 0, y: 1 }, { t: 1, y: 3 }, { t: 2, y: 2 }, { t: 3, y: 5 }])!
    expect(fit.slope).toBeCloseTo((1 + 4 / 3) / 2, 12)
    // residuals 1, 1.8333, −0.3333, 1.5 → median 1.25 (derived by hand)
    expect(fit.intercept).toBeCloseTo(1.25, 12)
  })
  it('ignores one wild point that would tilt least squares (derived by hand)', () => {
    const fit = theilSen([{ t: 0, y: 0 }, { t: 1, y: 1 }, { t: 2, y: 2 }, { t: 3, y: 3 }, { t: 4, y: -20 }])!
    expect(fit.slope).toBe(1)
  })
  it('needs two distinct times', () => {
    expect(theilSen([{ t: 1, y: 2 }, { t: 1, y: 3 }])).toBeNull()
  })
})

describe('drift', () => {
  it('flags a fit falling by a factor e each year that will cross 100 before the due date (derived by hand)', () => {
    // ln FF = ln 2000 − t: at t = 3 (next due) the line gives 2000/e³ ≈ 99.6 < 100.
    const tests = [0, 1, 2].map(t => ({ t, fitFactor: 2000 * Math.exp(-t) }))
    const d = assessDrift({ tests, passLevel: 100, nextDueT: 3, dropFraction: 0.5 })!
    expect(d.fit!.slope).toBeCloseTo(-1, 12)
    expect(d.predictedAtDue).toBeCloseTo(2000 * Math.exp(-3), 6)
    expect(d.predictsFailBeforeDue).toBe(true)
    // latest 270.7 vs half the median 735.8/2 = 367.9 (derived by hand)
    expect(d.latestBelowOwnMedian).toBe(true)
    expect(d.flagged).toBe(true)
  })
  it('does not flag a steady fit, and needs three tests', () => {
    const steady = [0, 1, 2, 3].map(t => ({ t, fitFactor: 1500 + (t % 2) * 300 }))
    expect(assessDrift({ tests: steady, passLevel: 100, nextDueT: 4, dropFraction: 0.5 })!.flagged).toBe(false)
    expect(assessDrift({ tests: steady.slice(0, 2), passLevel: 100, nextDueT: 4, dropFraction: 0.5 })).toBeNull()
  })
})

describe('binomial funnel limits (Spiegelhalter 2005, appendix, from memory)', () => {
  it('binomial CDF: P(X ≤ 2 | n = 10, p = ½) = 56/1024 (derived by hand)', () => {
    expect(binomialCdf(2, 10, 0.5)).toBeCloseTo(56 / 1024, 12)
  })
  it('n = 10, p = ½, 2.5 % limit: r = 2, α = (56/1024 − 0.025)/(45/1024), limit 0.13244 (derived by hand)', () => {
    const alpha = (56 / 1024 - 0.025) / (45 / 1024)
    expect(binomialFunnelLimit(0.025, 10, 0.5)).toBeCloseTo((2 - alpha) / 10, 10)
  })
  it('approaches p ± 1.96·√(p(1−p)/n) for large n (derived: normal approximation)', () => {
    const l = binomialFunnelLimits(10000, 0.9)
    const half = 1.959964 * Math.sqrt(0.9 * 0.1 / 10000)
    expect(Math.abs(l.upper95 - (0.9 + half))).toBeLessThan(0.0003)
    expect(Math.abs(l.lower95 - (0.9 - half))).toBeLessThan(0.0003)
    expect(l.lower998).toBeLessThan(l.lower95)
    expect(l.upper998).toBeGreaterThan(l.upper95)
  })
  it('a small tester is not an outlier at a rate that would stand out for a big one (derived)', () => {
    expect(funnelPosition(0.6, binomialFunnelLimits(5, 0.9))).toBe('within')
    expect(funnelPosition(0.6, binomialFunnelLimits(200, 0.9))).toBe('below-998')
  })
})

describe('canonical movements', () => {
  it('counts bending-over (App. A Part I.A.14) and bending (Part I.C.4) as one movement', () => {
    expect(canonicalMovement('bending-over')).toBe('bending')
    expect(canonicalMovement('bending')).toBe('bending')
    expect(canonicalMovement('custom-reach')).toBe('custom-reach')
  })
  it('maps every exercise of the built-in protocols', () => {
    for (const e of [...STANDARD_PROTOCOL.exercises, ...MODIFIED_ELASTOMERIC_PROTOCOL.exercises, ...MODIFIED_FILTERING_FACEPIECE_PROTOCOL.exercises]) {
      expect(EXERCISE_MOVEMENTS[e.key], e.key).toBeDefined()
    }
    expect(new Set(STANDARD_PROTOCOL.exercises.map(e => canonicalMovement(e.key))).size).toBe(7)
  })
})
