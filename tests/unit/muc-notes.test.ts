import { describe, expect, it } from 'vitest'
import { PURE_SUBSTANCE_PPM, mucNotes } from '#shared/utils/compute/muc-notes'
import { maximumUseConcentration } from '#shared/utils/compute'

describe('notes beside an MUC', () => {
  it('flags an MUC above the pure substance in ppm', () => {
    // 1 ppm is one part per million by volume, so 1,000,000 ppm is the pure gas or vapour
    // (definition of the unit; common practice (no published source) for the flag itself).
    const muc = maximumUseConcentration(10_000, 500, null) // 5,000,000 ppm
    expect(muc.value).toBeGreaterThan(PURE_SUBSTANCE_PPM)
    expect(mucNotes(muc, 'ppm', null).map(n => n.kind)).toEqual(['above-pure-substance', 'no-idlh-cap'])
  })

  it('says when no IDLH was entered, and nothing when the MUC is capped at it', () => {
    // MUC = APF × limit, capped at the IDLH — 29 CFR 1910.134(b) and (d)(3)(i)(B) (from memory).
    expect(mucNotes(maximumUseConcentration(10, 50, null), 'ppm', null).map(n => n.kind)).toEqual(['no-idlh-cap'])
    expect(mucNotes(maximumUseConcentration(50, 100, 2000), 'ppm', 2000)).toEqual([])
    expect(mucNotes(maximumUseConcentration(10, 100, 2000), 'ppm', 2000)).toEqual([])
  })

  it('does not apply the ppm ceiling to other units', () => {
    expect(mucNotes({ value: 5e6, cappedAtIdlh: false }, 'mg/m3', 1e7)).toEqual([])
  })
})
