import { describe, expect, it } from 'vitest'
import { counterSchema, updateCounterSchema } from '../../shared/utils/equipment-schemas'
import { updateMaskTypeSchema } from '../../shared/utils/mask-schemas'
import { definedOnly } from '../../shared/utils/patch-schema'

// A partial edit must carry only what was sent (issue 8, item 5): no default may fill a field
// that the body left out. Common practice for PATCH (no published source).
describe('changesSchema', () => {
  it('keeps the create schema\'s defaults but drops them from the edit schema', () => {
    expect(counterSchema.parse({ serialNumber: 'C-1', sampleFlowCm3PerMin: 100 })).toMatchObject({ description: '', calibrationDueOn: null, siteId: null })
    expect(updateCounterSchema.parse({ active: false })).toEqual({ active: false })
    expect(updateMaskTypeSchema.parse({ name: 'Renamed' })).toEqual({ name: 'Renamed' })
  })

  it('still validates every field that is sent, with the create schema\'s message', () => {
    const result = updateCounterSchema.safeParse({ sampleFlowCm3PerMin: -1 })
    expect(result.success).toBe(false)
    expect(result.error?.issues[0]?.message).toMatch(/above 0 cm³\/min/)
  })

  it('lets a nullable field be cleared on purpose', () => {
    expect(updateMaskTypeSchema.parse({ headformPassLevel: null })).toEqual({ headformPassLevel: null })
  })

  it('definedOnly drops what was not sent', () => {
    expect(definedOnly({ a: 1, b: undefined, c: null })).toEqual({ a: 1, c: null })
    expect(definedOnly(undefined)).toEqual({})
  })
})
