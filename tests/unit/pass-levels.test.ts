import { describe, expect, it } from 'vitest'
import {
  RESPIRATOR_CLASSES,
  resolvePassLevel,
  validatePassLevelOverrides
} from '#shared/utils/compute'

describe('organization pass levels', () => {
  it('lets an organization raise a level', () => {
    const r = resolvePassLevel({ ruleSet: 'us-osha', respiratorClass: 'elastomeric-full-facepiece', overrides: { byFitCategory: { full: 1000 } } })
    expect(r.ok && r.value).toMatchObject({ level: 1000, ruleSetLevel: 500, raisedByOrganization: true })
  })

  it('prefers a respirator-class setting over a fit-category one', () => {
    const r = resolvePassLevel({
      ruleSet: 'us-osha',
      respiratorClass: 'filtering-facepiece',
      overrides: { byFitCategory: { half: 150 }, byRespiratorClass: { 'filtering-facepiece': 200 } }
    })
    expect(r.ok && r.value.level).toBe(200)
  })

  it.each([
    { ruleSet: 'us-osha' as const, overrides: { byFitCategory: { half: 50 } }, field: 'byFitCategory.half', message: 'Pass level for half facepiece (filtering or elastomeric) cannot be 50: United States (OSHA) requires at least 100 (29 CFR 1910.134(f)(7)); an organization may raise a pass level, never lower it' },
    { ruleSet: 'uk-hse' as const, overrides: { byFitCategory: { full: 500 } }, field: 'byFitCategory.full', message: 'Pass level for full facepiece cannot be 500: United Kingdom (HSE) requires at least 2000 (HSE INDG479 (2019), via secondary summaries); an organization may raise a pass level, never lower it' },
    { ruleSet: 'us-osha' as const, overrides: { byRespiratorClass: { 'papr-full-facepiece': 499 } }, field: 'byRespiratorClass.papr-full-facepiece', message: 'Pass level for Powered air-purifying, tight-fitting full facepiece cannot be 499: United States (OSHA) requires at least 500 (29 CFR 1910.134(f)(7)); an organization may raise a pass level, never lower it' }
  ])('refuses a level below the rule set ($field)', ({ ruleSet, overrides, field, message }) => {
    const r = validatePassLevelOverrides(ruleSet, overrides)
    expect(r.ok).toBe(false)
    expect(r.issues).toContainEqual(expect.objectContaining({ code: 'below-rule-set', field, message }))
    const resolved = resolvePassLevel({ ruleSet, respiratorClass: 'elastomeric-full-facepiece', overrides })
    expect(resolved.ok).toBe(false)
  })

  it('has no pass level for loose-fitting classes', () => {
    const r = resolvePassLevel({ ruleSet: 'us-osha', respiratorClass: 'papr-helmet-hood' })
    expect(r.ok).toBe(false)
    expect(r.issues[0]!.code).toBe('not-fit-tested')
  })

  it('gives every tight-fitting class a fit category and every class a label and APF', () => {
    for (const c of RESPIRATOR_CLASSES) {
      expect(c.label.length).toBeGreaterThan(0)
      expect(c.apf).toBeGreaterThan(0)
      expect(c.fitCategory === null).toBe(!c.tightFitting)
    }
    expect(new Set(RESPIRATOR_CLASSES.map(c => c.key)).size).toBe(RESPIRATOR_CLASSES.length)
  })
})
