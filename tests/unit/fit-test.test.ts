import { describe, expect, it } from 'vitest'
import { harmonicMean } from 'simple-statistics'
import fc from 'fast-check'
import {
  ComputeError,
  FIT_TEST_CAUTIONS,
  MODIFIED_FILTERING_FACEPIECE_PROTOCOL,
  STANDARD_PROTOCOL,
  computeFitTest,
  formatFitFactor,
  harmonicMeanFitFactor,
  limitingIndex,
  overallFitFactor,
  penetrationShares,
  unwrap
} from '#shared/utils/compute'
import type { ExerciseInput, Protocol } from '#shared/utils/compute'

const counted = (p: Protocol) => p.exercises.filter(e => e.counted)

function standardInputs(inMaskByKey: Record<string, number> = {}, ambient = 1000): ExerciseInput[] {
  return counted(STANDARD_PROTOCOL).map(e => ({
    exerciseKey: e.key,
    ambientBefore: ambient,
    ambientAfter: ambient,
    inMask: inMaskByKey[e.key] ?? 1
  }))
}

describe('computeFitTest', () => {
  it('finds the limiting exercise and its share of the penetration', () => {
    const result = computeFitTest({ protocol: STANDARD_PROTOCOL, exercises: standardInputs({ talking: 100 }), passLevel: 100 })
    expect(result.ok).toBe(true)
    if (!result.ok) return
    expect(result.overall.value).toBeCloseTo(66.04, 2)
    expect(result.overallText).toBe('66.0')
    expect(result.pass).toBe(false)
    expect(result.limiting.exerciseName).toBe('Talking')
    expect(result.limiting.penetrationShare).toBeCloseTo(100 / 106, 9)
    const shares = result.exercises.filter(e => e.counted).map(e => e.penetrationShare!)
    expect(shares.reduce((a, b) => a + b, 0)).toBeCloseTo(1, 12)
    expect(result.exercises.find(e => e.exerciseKey === 'grimace')?.penetrationShare).toBeNull()
    expect(result.cautions).toBe(FIT_TEST_CAUTIONS)
  })

  it('passes at exactly the pass level even through floating-point rounding', () => {
    const result = computeFitTest({ protocol: STANDARD_PROTOCOL, exercises: standardInputs({}, 100), passLevel: 100 })
    expect(result.ok && result.pass).toBe(true)
  })

  it('leaves the grimace out of the overall even when readings are entered for it', () => {
    const withGrimace = [...standardInputs(), { exerciseKey: 'grimace', ambientBefore: 1000, ambientAfter: 1000, inMask: 500 }]
    const result = computeFitTest({ protocol: STANDARD_PROTOCOL, exercises: withGrimace, passLevel: 100 })
    expect(result.ok && result.overall.value).toBeCloseTo(1000, 9)
    expect(result.exercises.find(e => e.exerciseKey === 'grimace')?.fitFactor?.value).toBe(2)
  })

  it.each([
    { field: 'ambientBefore', value: 0, message: 'Ambient before for \'Talking\' must be a positive number' },
    { field: 'ambientBefore', value: -5, message: 'Ambient before for \'Talking\' must be a positive number' },
    { field: 'ambientAfter', value: Number.NaN, message: 'Ambient after for \'Talking\' must be a positive number' },
    { field: 'ambientAfter', value: Number.POSITIVE_INFINITY, message: 'Ambient after for \'Talking\' must be a positive number' },
    { field: 'ambientAfter', value: undefined, message: 'Ambient after for \'Talking\' is missing; enter a positive number' },
    { field: 'inMask', value: -1, message: 'In-mask concentration for \'Talking\' must be zero or a positive number' },
    { field: 'inMask', value: null, message: 'In-mask concentration for \'Talking\' is missing; enter zero or a positive number' },
    { field: 'inMask', value: 0, message: 'In-mask concentration for \'Talking\' is zero; enter the sample flow so a lower bound on the fit factor can be given' }
  ])('names the exercise and field when $field is $value', ({ field, value, message }) => {
    const exercises = standardInputs().map(e => e.exerciseKey === 'talking' ? { ...e, [field]: value } : e)
    const result = computeFitTest({ protocol: STANDARD_PROTOCOL, exercises, passLevel: 100 })
    expect(result.ok).toBe(false)
    expect(result.issues).toContainEqual(expect.objectContaining({ exerciseKey: 'talking', exerciseName: 'Talking', field, message, severity: 'error' }))
    expect(result.overall).toBeNull()
    // the other exercises still show their factors in a preview
    expect(result.exercises.find(e => e.exerciseKey === 'deep-breathing')?.fitFactor?.value).toBe(1000)
  })

  it('reports a missing exercise, an unknown one and a duplicate', () => {
    const exercises = standardInputs().filter(e => e.exerciseKey !== 'bending-over')
    exercises.push({ exerciseKey: 'hopping', ambientBefore: 1, ambientAfter: 1, inMask: 1 })
    exercises.push({ ...exercises[0]! })
    const result = computeFitTest({ protocol: STANDARD_PROTOCOL, exercises, passLevel: 100 })
    expect(result.issues.map(i => i.message)).toEqual(expect.arrayContaining([
      'No readings entered for \'Bending over\'',
      'Exercise \'hopping\' is not part of the Standard protocol',
      '\'Normal breathing (start)\' is entered twice; keep one set of readings'
    ]))
  })

  it('rejects a pass level that is not a positive number', () => {
    const result = computeFitTest({ protocol: STANDARD_PROTOCOL, exercises: standardInputs(), passLevel: 0 })
    expect(result.issues).toContainEqual(expect.objectContaining({ field: 'passLevel', message: 'Pass level must be a positive number' }))
  })

  it('gives a lower bound, never Infinity, for a zero in-mask count with a known sample volume', () => {
    const exercises = standardInputs({ talking: 0 })
    const result = computeFitTest({ protocol: STANDARD_PROTOCOL, exercises, passLevel: 100, sampleFlowCm3PerMin: 350 })
    expect(result.ok).toBe(true)
    if (!result.ok) return
    const talking = result.exercises.find(e => e.exerciseKey === 'talking')!
    // ambient·Q·t / 2.9957 with Q = 350/60 cm³/s and the protocol's 46 s in-mask sample
    expect(talking.fitFactor).toEqual({ value: expect.closeTo(1000 * (350 / 60) * 46 / -Math.log(0.05), 6), isLowerBound: true })
    expect(formatFitFactor(talking.fitFactor!)).toBe('> 89571')
    expect(talking.interval?.upper).toBeNull()
    expect(result.overall.isLowerBound).toBe(true)
    expect(result.overallText.startsWith('> ')).toBe(true)
    expect(Number.isFinite(result.overall.value)).toBe(true)
  })

  it('warns when a lower-bound overall does not reach the level', () => {
    const exercises = counted(STANDARD_PROTOCOL).map(e => ({ exerciseKey: e.key, ambientBefore: 1, ambientAfter: 1, inMask: 0 }))
    const result = computeFitTest({ protocol: STANDARD_PROTOCOL, exercises, passLevel: 500, sampleFlowCm3PerMin: 100 })
    expect(result.ok && result.pass).toBe(false)
    expect(result.issues).toContainEqual(expect.objectContaining({ severity: 'warning', code: 'lower-bound-below-level' }))
  })

  it('works out the in-mask concentration from a count and the sample volume', () => {
    const exercises = standardInputs().map(e => ({ ...e, inMask: null, inMaskCount: 100, inMaskSeconds: 60 }))
    const result = computeFitTest({ protocol: STANDARD_PROTOCOL, exercises, passLevel: 100, sampleFlowCm3PerMin: 100 })
    // V = 100 cm³; 100 particles → 1 /cm³ → FF 1000
    expect(result.ok && result.overall.value).toBeCloseTo(1000, 9)
    const first = result.exercises[0]!
    // FF interval = ambient·V / Garwood bounds of N = 100 (121.627, 81.364)
    expect(first.interval?.lower).toBeCloseTo(1000 * 100 / 121.627, 1)
    expect(first.interval?.upper).toBeCloseTo(1000 * 100 / 81.364, 1)
    expect(first.interval?.countEstimated).toBe(false)
  })

  it('uses the whole-test ambient for a modified protocol', () => {
    const exercises = counted(MODIFIED_FILTERING_FACEPIECE_PROTOCOL).map(e => ({ exerciseKey: e.key, inMask: 10 }))
    const missing = computeFitTest({ protocol: MODIFIED_FILTERING_FACEPIECE_PROTOCOL, exercises, passLevel: 100 })
    expect(missing.issues.map(i => i.message)).toContain('Ambient at the start of the test is missing; enter a positive number')
    const result = computeFitTest({ protocol: MODIFIED_FILTERING_FACEPIECE_PROTOCOL, exercises, passLevel: 100, wholeTestAmbient: { start: 2000, end: 4000 } })
    expect(result.ok && result.overall.value).toBeCloseTo(300, 9)
    expect(result.ok && result.pass).toBe(true)
  })

  it('unwraps into a ComputeError carrying the issues for server code', () => {
    const bad = computeFitTest({ protocol: STANDARD_PROTOCOL, exercises: [], passLevel: 100 })
    expect(() => unwrap(bad.ok ? { ok: true, value: bad, issues: [] } : { ok: false, issues: bad.issues })).toThrow(ComputeError)
  })
})

describe('fit factor helpers', () => {
  it('formats by cutting, never rounding up to a pass level', () => {
    expect(formatFitFactor(99.99)).toBe('99.9')
    expect(formatFitFactor(99.99, 2)).toBe('99.99')
    expect(formatFitFactor(66.0377)).toBe('66.0')
    expect(formatFitFactor(2074.9)).toBe('2074')
    expect(formatFitFactor({ value: 89573.9, isLowerBound: true })).toBe('> 89573')
    expect(formatFitFactor(5.678)).toBe('5.67')
  })

  it('agrees with simple-statistics harmonicMean (cross-check)', () => {
    fc.assert(fc.property(
      fc.array(fc.double({ min: 1, max: 1e6, noNaN: true }), { minLength: 1, maxLength: 12 }),
      (values) => {
        const ours = harmonicMeanFitFactor(values)
        expect(Math.abs(ours - harmonicMean(values)) / ours).toBeLessThan(1e-12)
      }
    ))
  })

  it('marks the overall a lower bound when any exercise is one', () => {
    expect(overallFitFactor([{ value: 200, isLowerBound: false }, { value: 5000, isLowerBound: true }]).isLowerBound).toBe(true)
  })

  it('picks the first of equal lowest factors as limiting', () => {
    expect(limitingIndex([300, 50, 50, 900])).toBe(1)
    expect(penetrationShares([100, 100])).toEqual([0.5, 0.5])
  })
})
