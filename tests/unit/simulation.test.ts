import { describe, expect, it } from 'vitest'
import {
  MODIFIED_FILTERING_FACEPIECE_PROTOCOL,
  STANDARD_PROTOCOL,
  mulberry32,
  samplePoisson,
  simulateFitTest,
  simulateFitTests
} from '#shared/utils/compute'

function meanAndVariance(values: number[]): { mean: number, variance: number } {
  const mean = values.reduce((a, b) => a + b, 0) / values.length
  const variance = values.reduce((a, b) => a + (b - mean) ** 2, 0) / (values.length - 1)
  return { mean, variance }
}

describe('seeded generator and Poisson sampler', () => {
  it('repeats itself for the same seed and differs for another', () => {
    const a = mulberry32(42)
    const b = mulberry32(42)
    const c = mulberry32(43)
    const seqA = [a(), a(), a()]
    expect([b(), b(), b()]).toEqual(seqA)
    expect([c(), c(), c()]).not.toEqual(seqA)
    for (const x of seqA) expect(x >= 0 && x < 1).toBe(true)
  })

  it.each([
    { mean: 0.5 }, { mean: 3 }, { mean: 9.9 }, { mean: 10 }, { mean: 120 }, { mean: 5000 }, { mean: 2e6 }
  ])('draws counts with mean and variance ≈ $mean', ({ mean }) => {
    const random = mulberry32(7)
    const draws = Array.from({ length: 20000 }, () => samplePoisson(mean, random))
    const stats = meanAndVariance(draws)
    // mean within 5 standard errors; variance within 10 %
    expect(Math.abs(stats.mean - mean)).toBeLessThan(5 * Math.sqrt(mean / draws.length))
    expect(Math.abs(stats.variance / mean - 1)).toBeLessThan(0.1)
    for (const d of draws.slice(0, 100)) expect(Number.isInteger(d) && d >= 0).toBe(true)
  })
})

describe('simulated fit tests (training lab)', () => {
  const base = { protocol: STANDARD_PROTOCOL, ambient: 1000, sampleFlowCm3PerMin: 100, passLevel: 100, seed: 2024 }

  it('is reproducible from its seed', () => {
    const a = simulateFitTest({ ...base, trueFitFactors: 150 })
    const b = simulateFitTest({ ...base, trueFitFactors: 150 })
    expect(a).toEqual(b)
    expect(a.exercises).toHaveLength(7)
    expect(a.trueOverall).toBeCloseTo(150, 9)
  })

  it('nearly always passes a wearer far above the level, rarely one far below', () => {
    const high = simulateFitTests({ ...base, trueFitFactors: 1000, runs: 200 })
    const low = simulateFitTests({ ...base, trueFitFactors: 20, runs: 200 })
    expect(high.passProbability).toBe(1)
    expect(low.passProbability).toBe(0)
    expect(high.percentiles.p5).toBeLessThan(high.percentiles.p50)
    expect(high.percentiles.p50).toBeLessThan(high.percentiles.p95)
  })

  it('is a coin toss at the pass level', () => {
    const edge = simulateFitTests({ ...base, trueFitFactors: 100, runs: 400 })
    expect(edge.passProbability).toBeGreaterThan(0.3)
    expect(edge.passProbability).toBeLessThan(0.7)
    expect(edge.percentiles.p50).toBeGreaterThan(90)
    expect(edge.percentiles.p50).toBeLessThan(110)
  })

  it('spreads the result more when the counter is slower and the room cleaner', () => {
    const spread = (ambient: number, flow: number) => {
      const s = simulateFitTests({ ...base, ambient, sampleFlowCm3PerMin: flow, trueFitFactors: 2000, passLevel: 500, runs: 300 })
      return s.percentiles.p95 / s.percentiles.p5
    }
    expect(spread(100, 100)).toBeGreaterThan(spread(5000, 350))
  })

  it('takes one true factor per exercise, and a modified protocol', () => {
    const keys = MODIFIED_FILTERING_FACEPIECE_PROTOCOL.exercises.map(e => e.key)
    const trueFitFactors = Object.fromEntries(keys.map((k, i) => [k, i === 0 ? 30 : 3000]))
    const run = simulateFitTest({ ...base, protocol: MODIFIED_FILTERING_FACEPIECE_PROTOCOL, trueFitFactors })
    expect(run.exercises.map(e => e.trueFitFactor)).toEqual([30, 3000, 3000, 3000])
    expect(run.truePass).toBe(true)
  })
})
