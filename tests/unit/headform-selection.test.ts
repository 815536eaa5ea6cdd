import { describe, expect, it } from 'vitest'
import {
  CAUTION_MUC_NOT_FOR_IDLH,
  HEADFORM_DEFAULT_PASS_LEVEL,
  IDLH_SELECTION_MESSAGE,
  acceptanceRuleSchema,
  benchProtectionFactor,
  computeHeadformTest,
  describeAcceptanceRule,
  evaluateAcceptanceRule,
  hazardRatio,
  resolveHeadformPassLevel,
  selectRespirators
} from '#shared/utils/compute'
import type { AcceptanceRule } from '#shared/utils/compute'

describe('acceptance rules', () => {
  it.each([
    { rule: { kind: 'at-most', max: 20, unit: 'Pa' }, value: 20, passed: true, message: '20 Pa is at most 20 Pa' },
    { rule: { kind: 'at-most', max: 20, unit: 'Pa' }, value: 20.1, passed: false, message: '20.1 Pa is above the maximum of 20 Pa' },
    { rule: { kind: 'at-least', min: 25000 }, value: 25000, passed: true, message: '25000 is at least 25000' },
    { rule: { kind: 'at-least', min: 25000 }, value: 24999, passed: false, message: '24999 is below the minimum of 25000' },
    { rule: { kind: 'between', min: 0.9, max: 1.1, unit: 'L/min' }, value: 0.9, passed: true, message: '0.9 L/min is between 0.9 L/min and 1.1 L/min' },
    { rule: { kind: 'between', min: 0.9, max: 1.1, unit: 'L/min' }, value: 1.2, passed: false, message: '1.2 L/min is above the maximum of 1.1 L/min' },
    { rule: { kind: 'pass-fail' }, value: false, passed: false, message: 'The value: fail' }
  ] as { rule: AcceptanceRule, value: number | boolean, passed: boolean, message: string }[])(
    '$rule.kind with $value → $passed',
    ({ rule, value, passed, message }) => {
      const r = evaluateAcceptanceRule(rule, value)
      expect(r.ok && r.value).toEqual({ passed, message })
    }
  )

  it('asks for a value that is missing or of the wrong kind', () => {
    expect(evaluateAcceptanceRule({ kind: 'at-most', max: 1 }, null, 'Zero check').issues[0]!.message).toBe('Zero check is missing; enter a number')
    expect(evaluateAcceptanceRule({ kind: 'pass-fail' }, 3, 'Valve flap').issues[0]!.message).toBe('Valve flap needs a pass or fail')
  })

  it('validates rules with a schema and describes them', () => {
    expect(acceptanceRuleSchema.safeParse({ kind: 'between', min: 3, max: 1 }).success).toBe(false)
    expect(acceptanceRuleSchema.safeParse({ kind: 'at-least', min: 1 }).success).toBe(true)
    expect(describeAcceptanceRule({ kind: 'at-most', max: 20, unit: 'Pa' })).toBe('≤ 20 Pa')
  })
})

describe('headform tests', () => {
  it('divides outside by inside', () => {
    const r = benchProtectionFactor({ outside: 30000, inside: 6 })
    expect(r.value.factor).toEqual({ value: 5000, isLowerBound: false })
    expect(r.value.text).toBe('5000')
  })

  it('gives a lower bound for a zero inside reading with a known volume, an issue without one', () => {
    const bound = benchProtectionFactor({ outside: 30000, inside: 0, sampleFlowCm3PerMin: 350, sampleSeconds: 60 })
    expect(bound.value.factor?.isLowerBound).toBe(true)
    expect(bound.value.factor?.value).toBeCloseTo(30000 * 350 / -Math.log(0.05), 6)
    expect(bound.value.text?.startsWith('> ')).toBe(true)
    const none = benchProtectionFactor({ outside: 30000, inside: 0 })
    expect(none.issues[0]!.code).toBe('zero-without-volume')
  })

  it('combines the factor and the sub-checks into one verdict', () => {
    const input = {
      bench: { outside: 30000, inside: 10 },
      passLevel: 2000,
      subChecks: [
        { key: 'valve', label: 'Exhalation valve leak', rule: { kind: 'at-most', max: 5, unit: 'Pa' } as AcceptanceRule, value: 3 },
        { key: 'straps', label: 'Straps', rule: { kind: 'pass-fail' } as AcceptanceRule, value: true }
      ]
    }
    expect(computeHeadformTest(input).passed).toBe(true)
    const failing = computeHeadformTest({ ...input, subChecks: [{ ...input.subChecks[0]!, value: 6 }] })
    expect(failing.passed).toBe(false)
    expect(failing.factorPassed).toBe(true)
    const unsure = computeHeadformTest({ ...input, subChecks: [{ ...input.subChecks[1]!, value: null }] })
    expect(unsure.passed).toBeNull()
    expect(unsure.issues[0]!.field).toBe('subChecks.straps')
  })

  it('takes the pass level from the program or offers the labelled default', () => {
    expect(resolveHeadformPassLevel({ 'cbrn-full': 5000 }, 'cbrn-full')).toEqual({ level: 5000, label: 'Program setting', isDefault: false })
    expect(resolveHeadformPassLevel(undefined, 'cbrn-full')).toEqual({ level: 2000, label: HEADFORM_DEFAULT_PASS_LEVEL.label, isDefault: true })
  })
})

describe('selection', () => {
  it('lists the adequate classes with their MUC, lowest APF first', () => {
    const r = selectRespirators({ exposure: 400, exposureLimit: 10, idlh: 1000 })
    expect(r.ok).toBe(true)
    if (!r.ok) return
    expect(r.value.hazardRatio).toBe(40)
    expect(r.value.adequate.every(a => a.respiratorClass.apf >= 40)).toBe(true)
    expect(r.value.inadequate.map(c => c.key)).toContain('elastomeric-half-mask')
    const fullApr = r.value.adequate.find(a => a.respiratorClass.key === 'elastomeric-full-facepiece')!
    expect(fullApr.muc).toEqual({ value: 500, cappedAtIdlh: false })
    const papr = r.value.adequate.find(a => a.respiratorClass.key === 'papr-full-facepiece')!
    expect(papr.muc).toEqual({ value: 1000, cappedAtIdlh: true })
    expect(r.value.cautions).toContain(CAUTION_MUC_NOT_FOR_IDLH)
  })

  it('refuses air-purifying classes and MUC in an IDLH atmosphere', () => {
    const r = selectRespirators({ exposure: 1200, exposureLimit: 10, idlh: 1000 })
    expect(r.ok && r.value.idlhAtmosphere).toBe(true)
    if (!r.ok) return
    expect(r.value.adequate.map(a => a.respiratorClass.key)).toEqual(['scba-pressure-demand-full-facepiece'])
    expect(r.value.adequate.every(a => a.muc === null)).toBe(true)
    expect(r.value.adequate.some(a => a.respiratorClass.airPurifying)).toBe(false)
    expect(r.issues).toContainEqual(expect.objectContaining({ code: 'idlh-atmosphere', message: IDLH_SELECTION_MESSAGE }))
  })

  it('checks its inputs', () => {
    const r = selectRespirators({ exposure: 5, exposureLimit: 0 })
    expect(r.ok).toBe(false)
    expect(r.issues[0]!.message).toBe('Exposure limit must be a positive number')
    expect(hazardRatio(50, 5)).toBe(10)
  })
})
