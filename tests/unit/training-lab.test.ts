import { describe, expect, it } from 'vitest'
import {
  MODIFIED_ELASTOMERIC_PROTOCOL,
  STANDARD_PROTOCOL,
  fastRunner,
  harmonicMeanFitFactor,
  mulberry32,
  operatingCharacteristic,
  passProbability,
  poissonCdf,
  scaleProfile,
  simulateCountTrace,
  simulateFitTest,
  simulateFitTestResult,
  simulateFitTests
} from '#shared/utils/compute'
import type { Protocol } from '#shared/utils/compute'
import { LEAK_PRESETS, checkLabField, decodeLabQuery, defaultLabState, encodeLabQuery, planCurve, planSetup, readLabNumber, rewriteLabNumbers } from '#shared/utils/lab-setup'

// A protocol whose counted exercises all sample the same seconds, so the exact method applies.
// Invented for the test: three exercises of 40 s in-mask sample.
const EVEN_PROTOCOL: Protocol = {
  ...STANDARD_PROTOCOL,
  key: 'test-even',
  name: 'Test protocol, equal samples',
  exercises: STANDARD_PROTOCOL.exercises.slice(0, 3).map(e => ({ ...e, sampling: { ...e.sampling, maskSeconds: 40, closingAmbientSeconds: 0 } }))
}

describe('planner', () => {
  it.each([
    // C, Q, FF, r, expected seconds, source
    { c: 1000, q: 100, ff: 2000, r: 0.1, seconds: 120, source: 'DOMAIN.md Test length check (derived from N = C·Q·t, RSD = 1/√N)' },
    { c: 1000, q: 100, ff: 500, r: 0.1, seconds: 30, source: 'DOMAIN.md Test length check (derived)' },
    { c: 1000, q: 350, ff: 2000, r: 0.1, seconds: 120 / 3.5, source: 'derived: t ∝ 1/Q, 350 cm³/min is common practice (no published source)' },
    { c: 25000, q: 100, ff: 2000, r: 0.1, seconds: 4.8, source: 'derived: t ∝ 1/C; 25,000 /cm³ hood is common practice (no published source)' }
  ])('needs $seconds s at C=$c, Q=$q, FF=$ff, r=$r ($source)', ({ c, q, ff, r, seconds }) => {
    const answer = planSetup({ ambient: c, flowCm3PerMin: q }, { fitFactor: ff, precision: r, sampleSeconds: seconds })
    expect(answer.secondsForTarget).toBeCloseTo(seconds, 9)
    // at r = 10 %, 1/r² = 100 counts (derived: RSD = 1/√N)
    expect(answer.expectedCountAtTarget).toBeCloseTo(1 / r ** 2, 9)
    // in the same time, the largest resolvable fit factor is the target itself (derived)
    expect(answer.largestResolvable).toBeCloseTo(ff, 6)
  })

  it('shows a counter at 100 cm³/min needing 3.5 times as long as one at 350 (from memory: 350 / 100)', () => {
    const slow = planCurve({ ambient: 1000, flowCm3PerMin: 100 }, 0.1)
    const fast = planCurve({ ambient: 1000, flowCm3PerMin: 350 }, 0.1)
    slow.forEach((p, i) => expect(p.seconds / fast[i]!.seconds).toBeCloseTo(3.5, 9))
    expect(slow[0]!.fitFactor).toBeCloseTo(10, 9)
    expect(slow.at(-1)!.fitFactor).toBeCloseTo(100_000, 6)
  })
})

describe('lab input', () => {
  it.each([
    { field: 'ambient', text: '0', ok: false, why: 'zero concentration' },
    { field: 'ambient', text: '-5', ok: false, why: 'negative concentration' },
    { field: 'flow', text: '0', ok: false, why: 'zero flow' },
    { field: 'precisionPercent', text: '0', ok: false, why: 'precision must be inside (0, 100) %' },
    { field: 'precisionPercent', text: '100', ok: false, why: 'precision must be inside (0, 100) %' },
    { field: 'fitFactor', text: '1e9', ok: false, why: 'absurd fit factor' },
    { field: 'runs', text: '10001', ok: false, why: 'run count above the cap' },
    { field: 'runs', text: '2.5', ok: false, why: 'runs are whole' },
    { field: 'ambient', text: 'Infinity', ok: false, why: 'no Infinity' },
    { field: 'ambient', text: 'NaN', ok: false, why: 'no NaN' },
    { field: 'ambient', text: '1,5', ok: false, why: 'ambiguous with a point as decimal mark (DOMAIN.md Typing numbers)' },
    { field: 'ambient', text: '12,500', ok: true, why: 'thousands grouping (DOMAIN.md Typing numbers)' },
    { field: 'flow', text: '350 cm3/min', ok: false, why: 'units are refused (DOMAIN.md Typing numbers)' },
    { field: 'fitFactor', text: '1.2E+03', ok: true, why: 'exponent is read (DOMAIN.md Typing numbers)' }
  ] as const)('$field "$text" → ok=$ok ($why)', ({ field, text, ok }) => {
    const read = checkLabField(field, text)
    expect(read.ok).toBe(ok)
    if (!read.ok) expect(read.message.length).toBeGreaterThan(10)
  })

  it('reads grouped digits as one number', () => {
    expect(readLabNumber('12,500')).toEqual({ ok: true, value: 12500 })
    expect(readLabNumber('25 000')).toEqual({ ok: true, value: 25000 })
  })

  it('carries a set-up through a link as typed, and says what it could not use', () => {
    const state = { ...defaultLabState(), aFlow: '-3', fitFactor: '2000' }
    const back = decodeLabQuery(encodeLabQuery(state))
    expect(back.state).toEqual(state)
    expect(back.notices).toEqual([])
    const unknown = decodeLabQuery({ p: 'no-such-protocol' })
    expect(unknown.state.protocolKey).toBe('osha-standard')
    expect(unknown.notices[0]).toMatch(/does not know/)
  })

  it.each([
    { field: 'precisionPercent', text: '2,5', ok: true, why: 'comma as decimal mark (DOMAIN.md Typing numbers)' },
    { field: 'ambient', text: '12.500', ok: true, why: 'point groups thousands with a comma mark (DOMAIN.md Typing numbers)' },
    { field: 'flow', text: '3.5', ok: false, why: 'ambiguous with a comma as decimal mark (DOMAIN.md Typing numbers)' },
    { field: 'runs', text: '2,5', ok: false, why: 'runs are whole, read with a comma' }
  ] as const)('with a comma, $field "$text" → ok=$ok ($why)', ({ field, text, ok }) => {
    expect(checkLabField(field, text, 'comma').ok).toBe(ok)
  })

  it('reads with the organization\'s mark: "2,5" % is 2.5 with a comma', () => {
    expect(checkLabField('precisionPercent', '2,5', 'comma')).toEqual({ ok: true, value: 2.5 })
    expect(checkLabField('ambient', '12.500', 'comma')).toEqual({ ok: true, value: 12500 })
  })

  it('a link says when its numbers use a comma, and links without that read with a point as before', () => {
    const state = { ...defaultLabState(), precisionPercent: '2,5' }
    const query = encodeLabQuery(state, 'comma')
    expect(query.dm).toBe('comma')
    expect(decodeLabQuery(query)).toEqual({ state, notices: [], decimalMark: 'comma' })
    expect(encodeLabQuery(defaultLabState(), 'point').dm).toBeUndefined()
    expect(decodeLabQuery({ r: '2.5' }).decimalMark).toBe('point')
  })

  it('a link opened in the other mark is rewritten value for value, never given a new meaning', () => {
    const fromPoint = { ...defaultLabState(), precisionPercent: '2.5', ambient: '12,500', aFlow: '1,5', fitFactor: 'abc' }
    const { state, notices } = rewriteLabNumbers(fromPoint, 'point', 'comma')
    expect(state.precisionPercent).toBe('2,5')
    expect(state.ambient).toBe('12500')
    // "1,5" was refused with a point; with a comma it would read 1.5, so it is emptied and named.
    expect(state.aFlow).toBe('')
    expect(notices).toHaveLength(1)
    expect(notices[0]).toContain('Counter sample flow')
    // Refused in both marks: kept, so its own message shows beside the field.
    expect(state.fitFactor).toBe('abc')
    expect(checkLabField('precisionPercent', state.precisionPercent, 'comma')).toEqual({ ok: true, value: 2.5 })
    const back = rewriteLabNumbers(state, 'comma', 'point').state
    expect(back.precisionPercent).toBe('2.5')
    expect(rewriteLabNumbers(fromPoint, 'point', 'point').state).toBe(fromPoint)
  })

  it('offers presets only where the protocol has the exercise they are about', () => {
    const talking = LEAK_PRESETS.find(p => p.key === 'talking-leak')!
    expect(talking.factorsFor(STANDARD_PROTOCOL, 100)?.talking).toBe(10)
    expect(talking.factorsFor(MODIFIED_ELASTOMERIC_PROTOCOL, 100)).toBeNull()
  })
})

describe('probability of passing', () => {
  const base = { ambient: 1000, sampleFlowCm3PerMin: 100, passLevel: 100, seed: 11 }

  it.each([
    // Poisson CDF check values, derived by direct summation of e^-λ λ^k / k!
    { k: 0, mean: 1, p: Math.exp(-1) },
    { k: 2, mean: 3, p: Math.exp(-3) * (1 + 3 + 4.5) },
    { k: 10, mean: 10, p: 0.5830397501929852 }
  ])('Poisson CDF P(N ≤ $k | λ = $mean) (derived by summation)', ({ k, mean, p }) => {
    expect(poissonCdf(k, mean)).toBeCloseTo(p, 12)
  })

  it('approaches the normal value for a large mean (derived: Poisson ≈ normal, mean = variance = λ)', () => {
    // P(N ≤ λ) ≈ ½ + (½ + ⅙)·φ(0)/√λ: continuity correction plus the skewness term of the
    // Edgeworth expansion (derived; skewness of a Poisson is 1/√λ)
    const lambda = 1e6
    expect(poissonCdf(lambda, lambda)).toBeCloseTo(0.5 + (2 / 3) * 0.3989422804 / Math.sqrt(lambda), 6)
  })

  it('is near 1 far above the level and near 0 far below', () => {
    expect(passProbability({ ...base, protocol: STANDARD_PROTOCOL, trueFitFactors: 1000 }).probability).toBeGreaterThan(0.999999)
    expect(passProbability({ ...base, protocol: STANDARD_PROTOCOL, trueFitFactors: 20 }).probability).toBeLessThan(1e-6)
  })

  it('uses the exact Poisson sum for equal samples and agrees with the full simulation', () => {
    const input = { ...base, protocol: EVEN_PROTOCOL, trueFitFactors: 105 }
    const worked = passProbability(input)
    expect(worked.method).toBe('exact')
    const simulated = simulateFitTests({ ...input, runs: 4000 })
    // within 4 standard errors of a binomial proportion (derived)
    const se = Math.sqrt(worked.probability * (1 - worked.probability) / 4000)
    expect(Math.abs(simulated.passProbability - worked.probability)).toBeLessThan(4 * se)
  })

  it('uses the normal approximation for unequal samples with many counts, and agrees with the simulation', () => {
    const input = { ...base, protocol: STANDARD_PROTOCOL, trueFitFactors: 104 }
    const worked = passProbability(input)
    expect(worked.method).toBe('normal-approximation')
    const simulated = simulateFitTests({ ...input, runs: 4000 })
    const se = Math.sqrt(worked.probability * (1 - worked.probability) / 4000)
    // normal approximation error is small but not zero: allow 4 SE plus 0.01 (derived)
    expect(Math.abs(simulated.passProbability - worked.probability)).toBeLessThan(4 * se + 0.01)
  })

  it('keeps the normal approximation when one leaky exercise dominates the sum, and agrees with the simulation', () => {
    // invented leak pattern: talking at 10, the rest at 2000, scaled to a true overall of 102
    const profile = Object.fromEntries(STANDARD_PROTOCOL.exercises.filter(e => e.counted).map(e => [e.key, e.key === 'talking' ? 10 : 2000]))
    const input = { ...base, sampleFlowCm3PerMin: 350, protocol: STANDARD_PROTOCOL, trueFitFactors: scaleProfile(STANDARD_PROTOCOL, profile, 102) }
    const worked = passProbability(input)
    expect(worked.method).toBe('normal-approximation')
    const simulated = simulateFitTests({ ...input, runs: 4000 })
    const se = Math.sqrt(worked.probability * (1 - worked.probability) / 4000)
    expect(Math.abs(simulated.passProbability - worked.probability)).toBeLessThan(4 * se + 0.01)
  })

  it('bounds the chance far above the level when counts are few (Cantelli\'s inequality, derived)', () => {
    // expected in-mask counts about 1 per exercise: too few for the normal approximation
    const input = { ...base, ambient: 1000, protocol: MODIFIED_ELASTOMERIC_PROTOCOL, passLevel: 500, trueFitFactors: 50_000, runs: 4000 }
    const bounded = passProbability(input)
    expect(bounded.method).toBe('bound')
    expect(bounded.probability).toBeGreaterThanOrEqual(0.999)
    expect(simulateFitTests({ ...input, seed: 3 }).passProbability).toBeGreaterThanOrEqual(bounded.probability - 0.002)
  })

  it('does not call a wearer safe when a zero count could only show a lower bound below the level', () => {
    // 20 /cm³ at 100 cm³/min: a zero count bounds FF at only about 20·60/3 = 400 < 500 (derived),
    // so even a perfect seal cannot be shown to pass
    const perfect = passProbability({ ...base, ambient: 20, protocol: MODIFIED_ELASTOMERIC_PROTOCOL, passLevel: 500, trueFitFactors: 1e6, runs: 2000 })
    expect(perfect.probability).toBeLessThan(0.01)
  })

  it('falls back to a seeded Monte Carlo when counts are few, and agrees with the full simulation', () => {
    const input = { ...base, ambient: 20, protocol: MODIFIED_ELASTOMERIC_PROTOCOL, passLevel: 500, trueFitFactors: 500, runs: 4000 }
    const mc = passProbability(input)
    expect(mc.method).toBe('monte-carlo')
    expect(passProbability(input)).toEqual(mc)
    const simulated = simulateFitTests({ ...input, seed: 99 })
    const se = Math.sqrt(mc.probability * (1 - mc.probability) / 4000)
    expect(Math.abs(simulated.passProbability - mc.probability)).toBeLessThan(5 * se * Math.SQRT2)
  })

  it('draws an operating characteristic that rises through the level, steeper with a faster counter', () => {
    const oc = (flow: number) => operatingCharacteristic({ ...base, sampleFlowCm3PerMin: flow, protocol: STANDARD_PROTOCOL, profile: 1, fromFitFactor: 30, toFitFactor: 300, points: 61 })
    const slow = oc(100)
    const fast = oc(350)
    for (let i = 1; i < slow.points.length; i++) expect(slow.points[i]!.probability).toBeGreaterThanOrEqual(slow.points[i - 1]!.probability)
    expect(slow.at50! / 100).toBeCloseTo(1, 1)
    // the 5–95 % band is narrower for the faster counter (derived: RSD = 1/√N)
    expect(fast.at95! / fast.at5!).toBeLessThan(slow.at95! / slow.at5!)
  })

  it('scales a leak pattern to a chosen true overall', () => {
    const scaled = scaleProfile(STANDARD_PROTOCOL, { ...Object.fromEntries(STANDARD_PROTOCOL.exercises.map(e => [e.key, 1000])), talking: 10 }, 100)
    expect(harmonicMeanFitFactor(Object.values(scaled))).toBeCloseTo(100, 9)
  })
})

describe('simulated counts', () => {
  const base = { protocol: STANDARD_PROTOCOL, ambient: 1000, sampleFlowCm3PerMin: 100, passLevel: 100 }

  it('gives a mean in-mask count within statistical tolerance of C·Q·t/FF (derived from N = C·Q·t)', () => {
    const maskSeconds = 46
    const expected = 1000 * (100 / 60) * maskSeconds / 200
    const runs = 300
    let sum = 0
    for (let seed = 1; seed <= runs; seed++) {
      const run = simulateFitTestResult({ ...base, trueFitFactors: 200, seed })
      sum += run.exercises.find(e => e.exerciseKey === 'talking')!.inMaskCount
    }
    // mean of 300 Poisson draws: standard error √(λ/300); allow 5 of them
    expect(Math.abs(sum / runs - expected)).toBeLessThan(5 * Math.sqrt(expected / runs))
  })

  it('builds the result from the second-by-second counts it shows', () => {
    const trace = simulateCountTrace({ ...base, trueFitFactors: 150, seed: 5 })
    expect(trace.seconds).toHaveLength(435)
    const talking = trace.result.exercises.find(e => e.exerciseKey === 'talking')!
    const talkingIndex = STANDARD_PROTOCOL.exercises.findIndex(e => e.key === 'talking')
    const counted = trace.seconds.filter(s => s.exerciseIndex === talkingIndex && s.phase === 'mask').reduce((a, s) => a + s.count!, 0)
    expect(talking.interval?.inMaskCount).toBe(counted)
    expect(trace.seconds.filter(s => s.exerciseIndex === STANDARD_PROTOCOL.exercises.findIndex(e => e.key === 'grimace')).every(s => s.count === null)).toBe(true)
    expect(trace.result.ok).toBe(true)
    expect(simulateCountTrace({ ...base, trueFitFactors: 150, seed: 5 })).toEqual(trace)
  })

  it.each([
    { protocol: STANDARD_PROTOCOL, ambient: 1000, flow: 100, ff: 120 },
    { protocol: STANDARD_PROTOCOL, ambient: 30, flow: 100, ff: 900 },
    { protocol: MODIFIED_ELASTOMERIC_PROTOCOL, ambient: 1000, flow: 350, ff: 450 }
  ])('bulk runs agree with computeFitTest run by run ($protocol.key, C=$ambient, Q=$flow, FF=$ff)', ({ protocol, ambient, flow, ff }) => {
    const input = { protocol, ambient, sampleFlowCm3PerMin: flow, passLevel: 500, trueFitFactors: ff }
    const run = fastRunner({ ...input, seed: 0 })
    for (let seed = 1; seed <= 40; seed++) {
      const full = simulateFitTest({ ...input, seed })
      const fast = run(mulberry32(seed))
      expect(fast.overall).toBeCloseTo(full.overall!.value, 9)
      expect(fast.isLowerBound).toBe(full.overall!.isLowerBound)
      expect(fast.pass).toBe(full.pass)
    }
  })

  it('gives the same runs for the same seed', () => {
    const a = simulateFitTests({ ...base, trueFitFactors: 120, seed: 7, runs: 500 })
    const b = simulateFitTests({ ...base, trueFitFactors: 120, seed: 7, runs: 500 })
    expect(a).toEqual(b)
    expect(a.histogram.counts.reduce((x, y) => x + y, 0)).toBe(500)
  })
})
