import { describe, expect, it } from 'vitest'
import {
  geometricMean,
  geometricStandardDeviation,
  passRate,
  percentiles,
  summarizeFitFactors,
  wilsonInterval
} from '#shared/utils/compute'

describe('insight summaries', () => {
  it.each([
    { values: [100, 1000], gm: 316.2278, source: 'derived from the geometric-mean definition' },
    { values: [10, 100, 1000], gm: 100, source: 'derived from the geometric-mean definition' }
  ])('geometric mean of $values is $gm ($source)', ({ values, gm }) => {
    expect(geometricMean(values)).toBeCloseTo(gm, 3)
  })

  it.each([
    { values: [100, 1000], gsd: Math.exp(Math.log(10) / Math.SQRT2), source: 'derived: exp of the sample SD of ln values' },
    { values: [200, 200, 200], gsd: 1, source: 'derived: no spread' }
  ])('geometric SD of $values ($source)', ({ values, gsd }) => {
    expect(geometricStandardDeviation(values)).toBeCloseTo(gsd, 9)
  })

  it.each([
    { passed: 8, total: 10, lower: 0.4902, upper: 0.9433, source: 'derived from the Wilson (1927) score formula (hand calculation)' },
    { passed: 0, total: 10, lower: 0, upper: 0.2775, source: 'derived from the Wilson (1927) score formula (hand calculation)' },
    { passed: 10, total: 10, lower: 0.7225, upper: 1, source: 'derived from the Wilson (1927) score formula (hand calculation)' }
  ])('Wilson interval of $passed / $total is ($lower, $upper) ($source)', ({ passed, total, lower, upper }) => {
    const r = wilsonInterval(passed, total)
    expect(r.lower).toBeCloseTo(lower, 4)
    expect(r.upper).toBeCloseTo(upper, 4)
  })

  it('gives a pass rate from verdicts', () => {
    expect(passRate([true, true, false, true])).toMatchObject({ successes: 3, trials: 4, rate: 0.75 })
  })

  it('summarizes a set of fit factors', () => {
    const s = summarizeFitFactors([50, 120, 300, 800, 2000])
    expect(s).toMatchObject({ count: 5, min: 50, max: 2000, median: 300 })
    expect(s.geometricMean).toBeCloseTo(Math.exp((Math.log(50) + Math.log(120) + Math.log(300) + Math.log(800) + Math.log(2000)) / 5), 9)
    expect(percentiles([1, 2, 3, 4], [0.5])).toEqual([2.5])
  })

  it('refuses empty or non-positive data', () => {
    expect(() => geometricMean([])).toThrow(RangeError)
    expect(() => geometricMean([10, 0])).toThrow(RangeError)
    expect(() => wilsonInterval(3, 0)).toThrow(RangeError)
  })
})
