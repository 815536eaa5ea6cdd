import { describe, expect, it } from 'vitest'
import {
  CURRENT_COUNTER_FLOW_CM3_PER_MIN,
  HEADFORM_AEROSOL_MIN_CM3,
  HEADFORM_DEFAULT_PASS_LEVEL,
  MODIFIED_ELASTOMERIC_PROTOCOL,
  MODIFIED_FILTERING_FACEPIECE_PROTOCOL,
  OLDER_COUNTER_FLOW_CM3_PER_MIN,
  OLDER_COUNTER_SLOWDOWN,
  PASS_LEVEL_RULE_SETS,
  STANDARD_PROTOCOL,
  findRespiratorClass,
  harmonicMeanFitFactor,
  largestResolvableFitFactor,
  maximumUseConcentration,
  meetsPassLevel,
  poissonInterval,
  poissonUpperBound,
  protocolDurationSeconds,
  relativeStandardDeviation,
  resolvePassLevel,
  sampleSecondsForFitFactor,
  testLengthRatio,
  zeroCountFitFactorBound,
  sampleVolumeCm3
} from '#shared/utils/compute'
import type { PassLevelRuleSetKey } from '#shared/utils/compute'

// Every check value of DOMAIN.md, each with the source it comes from.

const HM_SOURCE = '29 CFR 1910.134 App. A Part I.C.2(c) (formula from memory)'
const HM_DERIVED = 'derived from the harmonic-mean formula of 29 CFR 1910.134 App. A Part I.C.2(c) (from memory)'

describe('overall fit factor (harmonic mean)', () => {
  it.each([
    { fitFactors: [1000, 1000, 1000, 1000, 1000, 1000, 10], overall: 66.04, digits: 2, source: HM_SOURCE },
    { fitFactors: [100, 100, 100, 100, 100, 100, 100], overall: 100, digits: 9, source: HM_DERIVED },
    { fitFactors: [100, 300], overall: 150, digits: 9, source: HM_DERIVED },
    { fitFactors: [50, 50, 200, 200], overall: 80, digits: 9, source: HM_DERIVED }
  ])('$fitFactors → $overall ($source)', ({ fitFactors, overall, digits }) => {
    expect(harmonicMeanFitFactor(fitFactors)).toBeCloseTo(overall, digits)
  })
})

describe('pass levels and the ≥ verdict', () => {
  it.each([
    { ruleSet: 'us-osha', respiratorClass: 'elastomeric-half-mask', level: 100, source: '29 CFR 1910.134(f)(7)' },
    { ruleSet: 'us-osha', respiratorClass: 'filtering-facepiece', level: 100, source: '29 CFR 1910.134(f)(7)' },
    { ruleSet: 'us-osha', respiratorClass: 'elastomeric-full-facepiece', level: 500, source: '29 CFR 1910.134(f)(7)' },
    { ruleSet: 'uk-hse', respiratorClass: 'filtering-facepiece', level: 100, source: 'HSE INDG479 (2019), via secondary summaries' },
    { ruleSet: 'uk-hse', respiratorClass: 'elastomeric-half-mask', level: 100, source: 'HSE INDG479 (2019), via secondary summaries' },
    { ruleSet: 'uk-hse', respiratorClass: 'elastomeric-full-facepiece', level: 2000, source: 'HSE INDG479 (2019), via secondary summaries' }
  ] as { ruleSet: PassLevelRuleSetKey, respiratorClass: string, level: number, source: string }[])(
    '$ruleSet $respiratorClass → $level ($source)',
    ({ ruleSet, respiratorClass, level, source }) => {
      const resolved = resolvePassLevel({ ruleSet, respiratorClass })
      expect(resolved.ok && resolved.value.level).toBe(level)
      expect(PASS_LEVEL_RULE_SETS[ruleSet].source).toBe(source)
    }
  )

  it.each([
    { overall: 100, level: 100, pass: true, source: '29 CFR 1910.134(f)(7) ("at least")' },
    { overall: 99.99, level: 100, pass: false, source: '29 CFR 1910.134(f)(7) ("at least")' },
    { overall: 500, level: 500, pass: true, source: '29 CFR 1910.134(f)(7) ("at least")' },
    { overall: 499.99, level: 500, pass: false, source: '29 CFR 1910.134(f)(7) ("at least")' },
    { overall: 2000, level: 2000, pass: true, source: 'HSE INDG479 (2019), via secondary summaries' },
    { overall: 1999.99, level: 2000, pass: false, source: 'HSE INDG479 (2019), via secondary summaries' }
  ])('overall $overall at level $level → pass $pass ($source)', ({ overall, level, pass }) => {
    expect(meetsPassLevel(overall, level)).toBe(pass)
  })
})

describe('counting statistics (Garwood exact Poisson interval, 95 %)', () => {
  const source = 'Garwood (1936) exact interval; check values from DOMAIN.md'
  it.each([
    { count: 0, lower: 0, upper: 3.6889, source },
    { count: 1, lower: 0.0253, upper: 5.5716, source },
    { count: 10, lower: 4.7954, upper: 18.3904, source },
    { count: 100, lower: 81.364, upper: 121.627, source }
  ])('N = $count → ($lower, $upper) ($source)', ({ count, lower, upper }) => {
    const interval = poissonInterval(count, 0.95)
    expect(interval.lower).toBeCloseTo(lower, 3)
    expect(interval.upper).toBeCloseTo(upper, 3)
  })

  it.each([
    { count: 0, upper: 2.9957, source: 'Garwood (1936), one-sided: −ln(0.05)' }
  ])('one-sided upper bound of N = $count → $upper ($source)', ({ count, upper }) => {
    expect(poissonUpperBound(count, 0.95)).toBeCloseTo(upper, 4)
  })

  it.each([
    { count: 100, rsd: 0.1, source: 'Poisson relative standard deviation 1/√N (DOMAIN.md)' },
    { count: 10000, rsd: 0.01, source: 'Poisson relative standard deviation 1/√N (DOMAIN.md)' }
  ])('RSD of N = $count → $rsd ($source)', ({ count, rsd }) => {
    expect(relativeStandardDeviation(count)).toBeCloseTo(rsd, 12)
  })

  it.each([
    {
      ambient: 1000, flowCm3PerMin: 350, seconds: 46, bound: 89571.9,
      source: 'derived from the one-sided Poisson bound (Garwood 1936): ambient·Q·t / 2.9957'
    }
  ])('zero in-mask count, ambient $ambient, $flowCm3PerMin cm³/min, $seconds s → FF > $bound ($source)', ({ ambient, flowCm3PerMin, seconds, bound }) => {
    const ff = zeroCountFitFactorBound(ambient, sampleVolumeCm3(flowCm3PerMin, seconds))
    expect(ff.isLowerBound).toBe(true)
    expect(ff.value).toBeCloseTo(bound, 0)
  })
})

describe('protocols', () => {
  it.each([
    { protocol: STANDARD_PROTOCOL, seconds: 435, counted: 7, source: '29 CFR 1910.134 App. A Part I.A.14; grimace not counted per 74 FR 3526 (2009), footnote 1' },
    { protocol: MODIFIED_ELASTOMERIC_PROTOCOL, seconds: 149, counted: 4, source: '29 CFR 1910.134 App. A Part I.C.4 (84 FR 50739, 2019)' },
    { protocol: MODIFIED_FILTERING_FACEPIECE_PROTOCOL, seconds: 149, counted: 4, source: '29 CFR 1910.134 App. A Part I.C.5 (84 FR 50739, 2019)' }
  ])('$protocol.key lasts $seconds s with $counted counted exercises ($source)', ({ protocol, seconds, counted }) => {
    expect(protocolDurationSeconds(protocol)).toBe(seconds)
    expect(protocol.exercises.filter(e => e.counted)).toHaveLength(counted)
  })
})

describe('test length', () => {
  const source = 'derived from N = C·Q·t and RSD = 1/√N (DOMAIN.md check values)'
  it.each([
    { ambient: 1000, flowCm3PerMin: 100, precision: 0.1, fitFactor: 2000, seconds: 120, source },
    { ambient: 1000, flowCm3PerMin: 100, precision: 0.1, fitFactor: 500, seconds: 30, source }
  ])('C $ambient /cm³, Q $flowCm3PerMin cm³/min, r $precision: FF $fitFactor needs $seconds s ($source)', ({ ambient, flowCm3PerMin, precision, fitFactor, seconds }) => {
    expect(sampleSecondsForFitFactor({ ambient, flowCm3PerMin }, fitFactor, precision)).toBeCloseTo(seconds, 9)
    expect(largestResolvableFitFactor({ ambient, flowCm3PerMin }, seconds, precision)).toBeCloseTo(fitFactor, 9)
  })

  it.each([
    { faster: 350, slower: 100, ratio: 3.5, source: 'from memory (older counters ≈ 100 cm³/min against ≈ 350 cm³/min)' }
  ])('a $slower cm³/min counter runs $ratio× longer than a $faster cm³/min one ($source)', ({ faster, slower, ratio }) => {
    expect(testLengthRatio(faster, slower)).toBeCloseTo(ratio, 12)
  })

  it.each([
    { rule: HEADFORM_AEROSOL_MIN_CM3, value: 25000, source: 'common practice (no published source)' },
    { rule: CURRENT_COUNTER_FLOW_CM3_PER_MIN, value: 350, source: 'common practice (no published source)' },
    { rule: OLDER_COUNTER_FLOW_CM3_PER_MIN, value: 100, source: 'from memory' },
    { rule: OLDER_COUNTER_SLOWDOWN, value: 3.5, source: 'from memory (350 / 100 cm³/min)' }
  ])('rule of thumb "$rule.label" = $value ($source)', ({ rule, value, source }) => {
    expect(rule.value).toBe(value)
    expect(rule.source).toBe(source)
  })
})

describe('selection', () => {
  it.each([
    { key: 'elastomeric-half-mask', apf: 10, source: '29 CFR 1910.134(d)(3)(i)(A), Table 1' },
    { key: 'filtering-facepiece', apf: 10, source: '29 CFR 1910.134(d)(3)(i)(A), Table 1' },
    { key: 'elastomeric-full-facepiece', apf: 50, source: '29 CFR 1910.134(d)(3)(i)(A), Table 1' },
    { key: 'papr-full-facepiece', apf: 1000, source: '29 CFR 1910.134(d)(3)(i)(A), Table 1' },
    { key: 'scba-pressure-demand-full-facepiece', apf: 10000, source: '29 CFR 1910.134(d)(3)(i)(A), Table 1' }
  ])('APF of $key is $apf ($source)', ({ key, apf, source }) => {
    const cls = findRespiratorClass(key)
    expect(cls?.apf).toBe(apf)
    expect(cls?.apfSource.startsWith(source)).toBe(true)
  })

  it.each([
    { apf: 10, exposureLimit: 50, idlh: null, muc: 500, capped: false, source: 'derived from MUC = APF × exposure limit (DOMAIN.md; 29 CFR 1910.134(d)(3)(i)(B), from memory)' },
    { apf: 50, exposureLimit: 50, idlh: 1000, muc: 1000, capped: true, source: 'derived from the IDLH cap of 29 CFR 1910.134(d)(3)(i)(B)(3) (from memory)' },
    { apf: 10, exposureLimit: 50, idlh: 1000, muc: 500, capped: false, source: 'derived from MUC = APF × exposure limit, IDLH higher so no cap' }
  ])('APF $apf × limit $exposureLimit (IDLH $idlh) → MUC $muc ($source)', ({ apf, exposureLimit, idlh, muc, capped }) => {
    expect(maximumUseConcentration(apf, exposureLimit, idlh)).toEqual({ value: muc, cappedAtIdlh: capped })
  })
})

describe('headform default pass level', () => {
  it.each([
    { value: 2000, source: 'NIOSH CBRN laboratory protection level (from memory)' }
  ])('default $value ($source)', ({ value, source }) => {
    expect(HEADFORM_DEFAULT_PASS_LEVEL.value).toBe(value)
    expect(HEADFORM_DEFAULT_PASS_LEVEL.label).toBe(source)
  })
})
