import { describe, expect, it } from 'vitest'
import { RESPIRATOR_CLASSES } from '#shared/utils/compute'
import { UK_PROTECTION_FACTORS, describeUkProtectionFactor, ukProtectionFactor } from '#shared/utils/compute/uk-protection-factors'

describe('UK protection factors for the catalogue', () => {
  it.each([
    ['filtering-facepiece', 'FFP1 4 · FFP2 10 · FFP3 20', false, 'HSE HSG53, via secondary summaries (DOMAIN.md)'],
    ['elastomeric-half-mask', '20 (P3 filter)', true, 'HSE HSG53, from memory (DOMAIN.md)'],
    ['elastomeric-full-facepiece', '40 (P3 filter)', true, 'HSE HSG53, from memory (DOMAIN.md)'],
    ['papr-helmet-hood', '40 (TH3)', true, 'HSE HSG53, from memory (DOMAIN.md)'],
    ['papr-full-facepiece', '40 (TM3)', true, 'HSE HSG53, from memory (DOMAIN.md)'],
    ['scba-pressure-demand-full-facepiece', '2000', true, 'HSE HSG53, from memory (DOMAIN.md)']
  ])('%s → %s (%s)', (key, text, fromMemory) => {
    const factor = ukProtectionFactor(key)!
    expect(describeUkProtectionFactor(factor)).toBe(text)
    expect(factor.fromMemory).toBe(fromMemory)
    expect(factor.source).toMatch(fromMemory ? /from memory/ : /secondary summaries/)
  })

  it('holds no guess for a class it has no value for, and only known classes', () => {
    expect(ukProtectionFactor('supplied-air-demand-half-mask')).toBeNull()
    const known = new Set(RESPIRATOR_CLASSES.map(c => c.key))
    for (const key of Object.keys(UK_PROTECTION_FACTORS)) expect(known.has(key), key).toBe(true)
  })
})
