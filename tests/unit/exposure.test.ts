import { describe, expect, it } from 'vitest'
import { RESPIRATOR_CLASSES, findRespiratorClass, maximumUseConcentration, selectionClassesFor } from '#shared/utils/compute'
import {
  convertConcentration,
  mgPerM3ToPpm,
  mixtureExposureIndex,
  ppmToMgPerM3,
  roundDownSignificant,
  roundUpSignificant,
  timeWeightedAverage
} from '#shared/utils/compute/exposure'
import { evaluateExposureAssessment } from '#shared/utils/compute/exposure-assessment'
import type { AssessmentInput, ContaminantInput } from '#shared/utils/compute/exposure-assessment'

function substance(over: Partial<ContaminantInput> = {}): ContaminantInput {
  return {
    name: 'Solvent A',
    form: 'gas-vapour',
    exposure: { mode: 'single', value: 50, unit: 'ppm' },
    limit: { value: 100, unit: 'ppm', kind: 'twa-8h', source: 'typed by the hygienist' },
    ...over
  }
}

function assessment(over: Partial<AssessmentInput> = {}): AssessmentInput {
  return { ruleSet: 'us-osha', contaminants: [substance()], additiveMixture: true, oxygenDeficient: false, ...over }
}

describe('8-hour time-weighted average', () => {
  it.each([
    {
      source: '29 CFR 1910.1000(d)(1)(i), the paragraph\'s own example (verified, text of (d)(1))',
      segments: [{ concentration: 150, hours: 2 }, { concentration: 75, hours: 2 }, { concentration: 50, hours: 4 }],
      twa: 81.25
    },
    {
      source: 'derived from 29 CFR 1910.1000(d)(1)(i): one level all shift is that level',
      segments: [{ concentration: 40, hours: 8 }],
      twa: 40
    },
    {
      source: 'derived from 29 CFR 1910.1000(d)(1)(i): an explicit zero segment counts as clean air',
      segments: [{ concentration: 80, hours: 4 }, { concentration: 0, hours: 4 }],
      twa: 40
    }
  ])('$twa ($source)', ({ segments, twa }) => {
    const r = timeWeightedAverage(segments)
    expect(r.ok && r.value.twa).toBe(twa)
  })

  it('refuses fewer than 8 hours instead of counting the missing hours as clean air', () => {
    const r = timeWeightedAverage([{ concentration: 150, hours: 2 }, { concentration: 75, hours: 2 }])
    expect(r.ok).toBe(false)
    expect(r.issues[0]!.field).toBe('segments')
    expect(r.issues[0]!.message).toContain('add up to 4 h')
    expect(r.issues[0]!.message).toContain('missing 4 h would count as clean air')
  })

  it('refuses more than 24 hours and warns above 8', () => {
    expect(timeWeightedAverage([{ concentration: 1, hours: 25 }]).issues[0]!.message).toContain('more than a day')
    const long = timeWeightedAverage([{ concentration: 100, hours: 10 }])
    expect(long.ok && long.value.twa).toBe(125)
    expect(long.issues[0]!.severity).toBe('warning')
  })

  it('names the segment field that is wrong', () => {
    const r = timeWeightedAverage([{ concentration: -1, hours: 8 }, { concentration: 3, hours: 0 }])
    expect(r.issues.map(i => i.field)).toEqual(['segments.0.concentration', 'segments.1.hours'])
  })
})

describe('mixtures with additive effects', () => {
  it('E_m = 500/1000 + 45/200 + 40/200 = 0.925 (29 CFR 1910.1000(d)(2)(i), its own example; verified, text of (d)(2))', () => {
    const r = mixtureExposureIndex([{ exposure: 500, limit: 1000 }, { exposure: 45, limit: 200 }, { exposure: 40, limit: 200 }])
    expect(r.ok && r.value).toBeCloseTo(0.925, 12)
  })

  it('refuses a limit of zero beside that substance', () => {
    const r = mixtureExposureIndex([{ exposure: 5, limit: 0 }])
    expect(r.issues[0]!.field).toBe('contaminants.0.limit.value')
  })

  it('the calculator gives the same mixture index and requires that as the protection factor', () => {
    const r = evaluateExposureAssessment(assessment({
      contaminants: [
        substance({ name: 'A', exposure: { mode: 'single', value: 500, unit: 'ppm' }, limit: { value: 1000, unit: 'ppm', kind: 'twa-8h', source: 'x' } }),
        substance({ name: 'B', exposure: { mode: 'single', value: 45, unit: 'ppm' }, limit: { value: 200, unit: 'ppm', kind: 'twa-8h', source: 'x' } }),
        substance({ name: 'C', exposure: { mode: 'single', value: 40, unit: 'ppm' }, limit: { value: 200, unit: 'ppm', kind: 'twa-8h', source: 'x' } })
      ]
    }))
    expect(r.ok && r.value.mixtureIndex).toBeCloseTo(0.925, 12)
    expect(r.ok && r.value.requiredProtectionFactor).toBeCloseTo(0.925, 12)
  })

  it('without additive effects the highest single hazard ratio is required', () => {
    const r = evaluateExposureAssessment(assessment({
      additiveMixture: false,
      contaminants: [substance({ exposure: { mode: 'single', value: 300, unit: 'ppm' } }), substance({ exposure: { mode: 'single', value: 500, unit: 'ppm' } })]
    }))
    expect(r.ok && r.value.mixtureIndex).toBeNull()
    expect(r.ok && r.value.requiredProtectionFactor).toBe(5)
  })
})

describe('ppm ↔ mg/m³ at 25 °C and 760 mmHg (24.45 L/mol)', () => {
  it('200 ppm of 2-butanone (MW 72.11) is 590 mg/m³ as OSHA\'s sampling method for it states (verified); exactly 589.9', () => {
    expect(ppmToMgPerM3(200, 72.11)).toBeCloseTo(589.857, 3)
    expect(Math.round(ppmToMgPerM3(200, 72.11))).toBe(590)
  })

  it('converts back (derived: the inverse of mg/m³ = ppm × MW ÷ 24.45)', () => {
    expect(mgPerM3ToPpm(589.857, 72.11)).toBeCloseTo(200, 3)
  })

  it('needs a molecular weight and refuses fibres to ppm', () => {
    expect(convertConcentration(200, 'ppm', 'mg/m3', null).issues[0]!.message).toContain('Molecular weight')
    expect(convertConcentration(1, 'f/cm3', 'ppm').issues[0]!.message).toContain('cannot be converted')
    expect(convertConcentration(3, 'f/cm3', 'f/cm3')).toEqual({ ok: true, value: 3, issues: [] })
  })

  it('the calculator converts an exposure typed in ppm to a limit in mg/m³', () => {
    const r = evaluateExposureAssessment(assessment({
      contaminants: [substance({ molecularWeight: 72.11, exposure: { mode: 'single', value: 200, unit: 'ppm' }, limit: { value: 590, unit: 'mg/m3', kind: 'twa-8h', source: 'x' } })]
    }))
    expect(r.ok && r.value.contaminants[0]!.converted).toBe(true)
    expect(r.ok && r.value.contaminants[0]!.hazardRatio).toBeCloseTo(589.857 / 590, 5)
  })

  it('asks for the molecular weight beside its field', () => {
    const r = evaluateExposureAssessment(assessment({ contaminants: [substance({ limit: { value: 590, unit: 'mg/m3', kind: 'twa-8h', source: 'x' } })] }))
    expect(r.ok).toBe(false)
    expect(r.issues[0]!.field).toBe('contaminants.0.molecularWeight')
  })
})

describe('assigned protection factors used by the calculator', () => {
  // Each row of 29 CFR 1910.134(d)(3)(i)(A) Table 1 (rows 1–2 verified; 3–4 from memory, high
  // confidence, as DOMAIN.md records them).
  it.each([
    ['elastomeric-quarter-mask', 5, 'Table 1, air-purifying quarter mask'],
    ['filtering-facepiece', 10, 'Table 1, air-purifying half mask (filtering facepieces included)'],
    ['elastomeric-half-mask', 10, 'Table 1, air-purifying half mask'],
    ['elastomeric-full-facepiece', 50, 'Table 1, air-purifying full facepiece'],
    ['papr-half-mask', 50, 'Table 1, powered air-purifying half mask'],
    ['papr-full-facepiece', 1000, 'Table 1, powered air-purifying full facepiece'],
    ['papr-helmet-hood', 25, 'Table 1, powered air-purifying helmet/hood without the maker\'s evidence'],
    ['papr-loose-fitting-facepiece', 25, 'Table 1, powered air-purifying loose-fitting facepiece'],
    ['supplied-air-demand-half-mask', 10, 'Table 1, supplied-air demand half mask'],
    ['supplied-air-demand-full-facepiece', 50, 'Table 1, supplied-air demand full facepiece'],
    ['supplied-air-continuous-half-mask', 50, 'Table 1, supplied-air continuous flow half mask'],
    ['supplied-air-continuous-full-facepiece', 1000, 'Table 1, supplied-air continuous flow full facepiece'],
    ['supplied-air-continuous-helmet-hood', 25, 'Table 1, supplied-air continuous flow helmet/hood without the maker\'s evidence'],
    ['supplied-air-continuous-loose-fitting', 25, 'Table 1, supplied-air continuous flow loose-fitting'],
    ['supplied-air-pressure-demand-half-mask', 50, 'Table 1, supplied-air pressure-demand half mask'],
    ['supplied-air-pressure-demand-full-facepiece', 1000, 'Table 1, supplied-air pressure-demand full facepiece'],
    ['scba-demand-half-mask', 10, 'Table 1, SCBA demand half mask'],
    ['scba-demand-full-facepiece', 50, 'Table 1, SCBA demand full facepiece'],
    ['scba-demand-helmet-hood', 50, 'Table 1, SCBA demand helmet/hood'],
    ['scba-pressure-demand-full-facepiece', 10000, 'Table 1, SCBA pressure-demand full facepiece'],
    ['scba-pressure-demand-helmet-hood', 10000, 'Table 1, SCBA pressure-demand helmet/hood']
  ])('%s: APF %i (%s)', (key, apf) => {
    expect(findRespiratorClass(key)?.apf).toBe(apf)
    const offered = selectionClassesFor('us-osha').find(c => c.key === key)
    expect(offered?.apf).toBe(apf)
    // A hazard ratio exactly at the APF is adequate, just above it is not.
    const at = evaluateExposureAssessment(assessment({ contaminants: [substance({ exposure: { mode: 'single', value: apf * 100, unit: 'ppm' } })] }))
    expect(at.ok && at.value.classes.find(c => c.selectionClass.key === key)?.adequate).toBe(true)
    const above = evaluateExposureAssessment(assessment({ contaminants: [substance({ exposure: { mode: 'single', value: apf * 100 + 1, unit: 'ppm' } })] }))
    expect(above.ok && above.value.classes.find(c => c.selectionClass.key === key)?.adequate).toBe(false)
  })

  it('offers every class of the table', () => {
    expect(selectionClassesFor('us-osha').map(c => c.key)).toEqual(RESPIRATOR_CLASSES.map(c => c.key))
  })

  it.each([
    ['uk-ffp1', 4, 'HSE HSG53 (confirmed by secondary summaries)'],
    ['uk-ffp2', 10, 'HSE HSG53 (confirmed by secondary summaries)'],
    ['uk-ffp3', 20, 'HSE HSG53 (confirmed by secondary summaries)'],
    ['uk-half-mask-p3', 20, 'HSE HSG53 (value from memory)'],
    ['uk-full-face-p3', 40, 'HSE HSG53 (value from memory)'],
    ['uk-powered-hood-th3', 40, 'HSE HSG53 (value from memory)'],
    ['uk-powered-full-face-tm3', 40, 'HSE HSG53 (value from memory)'],
    ['uk-scba-positive-pressure', 2000, 'HSE HSG53 (value from memory)']
  ])('UK %s: %i, source shown as "%s"', (key, apf, source) => {
    const cls = selectionClassesFor('uk-hse').find(c => c.key === key)
    expect(cls?.apf).toBe(apf)
    expect(cls?.apfSource).toBe(source)
  })
})

describe('maximum use concentration', () => {
  it('MUC = APF × limit, capped at the IDLH where lower (29 CFR 1910.134(d)(3)(i)(B), from memory, high confidence)', () => {
    expect(maximumUseConcentration(50, 100, 2000)).toEqual({ value: 2000, cappedAtIdlh: true })
    expect(maximumUseConcentration(10, 100, 2000)).toEqual({ value: 1000, cappedAtIdlh: false })
    const r = evaluateExposureAssessment(assessment({ contaminants: [substance({ idlh: 3000 })] }))
    const full = r.ok ? r.value.classes.find(c => c.selectionClass.key === 'elastomeric-full-facepiece') : undefined
    expect(full?.mucs[0]).toEqual({ value: 3000, cappedAtIdlh: true })
  })

  it('property (derived from the definition): MUC ÷ limit = APF unless capped', () => {
    let seed = 7
    const random = () => (seed = (seed * 16807) % 2147483647) / 2147483647
    for (let n = 0; n < 200; n += 1) {
      const limit = 0.01 + random() * 1000
      const idlh = random() < 0.5 ? null : limit * (1 + random() * 5000)
      const exposure = random() * limit * 20
      const r = evaluateExposureAssessment(assessment({ contaminants: [substance({ exposure: { mode: 'single', value: exposure, unit: 'ppm' }, limit: { value: limit, unit: 'ppm', kind: 'twa-8h', source: 'x' }, idlh })] }))
      if (!r.ok || r.value.idlhAtmosphere) continue
      for (const cls of r.value.classes) {
        const muc = cls.mucs[0]!
        if (muc.cappedAtIdlh) {
          expect(muc.value).toBe(idlh)
          expect(muc.value).toBeLessThan(cls.selectionClass.apf * limit)
        } else {
          expect(muc.value / limit).toBeCloseTo(cls.selectionClass.apf, 9)
        }
      }
    }
  })
})

describe('IDLH and oxygen-deficient atmospheres', () => {
  it('at or above the IDLH only the 29 CFR 1910.134(d)(2)(i) classes remain, with no MUC (from memory)', () => {
    const r = evaluateExposureAssessment(assessment({ contaminants: [substance({ exposure: { mode: 'single', value: 2000, unit: 'ppm' }, idlh: 2000 })] }))
    expect(r.ok && r.value.idlhAtmosphere).toBe(true)
    const adequate = r.ok ? r.value.classes.filter(c => c.adequate).map(c => c.selectionClass.key) : []
    expect(adequate).toEqual(['scba-pressure-demand-full-facepiece'])
    expect(r.ok && r.value.classes.every(c => c.mucs.every(m => m === null))).toBe(true)
    expect(r.issues.find(i => i.code === 'idlh-atmosphere')?.message).toContain('1910.134(d)(2)(i)')
  })

  it('an oxygen-deficient atmosphere forces the same classes whatever the ratio', () => {
    const r = evaluateExposureAssessment(assessment({ oxygenDeficient: true, contaminants: [substance({ exposure: { mode: 'single', value: 1, unit: 'ppm' } })] }))
    expect(r.ok && r.value.classes.filter(c => c.adequate).map(c => c.selectionClass.key)).toEqual(['scba-pressure-demand-full-facepiece'])
  })

  it('the UK rule set keeps only positive-pressure breathing apparatus', () => {
    const r = evaluateExposureAssessment(assessment({ ruleSet: 'uk-hse', oxygenDeficient: true }))
    expect(r.ok && r.value.classes.filter(c => c.adequate).map(c => c.selectionClass.key)).toEqual(['uk-scba-positive-pressure'])
  })

  it('refuses an IDLH below the limit beside the IDLH field', () => {
    const r = evaluateExposureAssessment(assessment({ contaminants: [substance({ idlh: 50 })] }))
    expect(r.ok).toBe(false)
    expect(r.issues[0]!.field).toBe('contaminants.0.idlh')
  })
})

describe('bad input and cautions', () => {
  it.each([
    [{ limit: { value: 0, unit: 'ppm', kind: 'twa-8h', source: '' } }, 'contaminants.0.limit.value'],
    [{ exposure: { mode: 'single', value: -3, unit: 'ppm' } }, 'contaminants.0.exposure.value'],
    [{ exposure: { mode: 'single', value: null, unit: 'ppm' } }, 'contaminants.0.exposure.value'],
    [{ exposure: { mode: 'segments', unit: 'ppm', segments: [{ concentration: 10, hours: 8 }] }, limit: { value: 100, unit: 'ppm', kind: 'stel', source: '' } }, 'contaminants.0.exposure.mode']
  ] as [Partial<ContaminantInput>, string][])('names the field (%#)', (over, field) => {
    const r = evaluateExposureAssessment(assessment({ contaminants: [substance(over)] }))
    expect(r.ok).toBe(false)
    expect(r.issues.map(i => i.field)).toContain(field)
  })

  it('carries the program, IDLH, qualified-person and jurisdiction cautions, and the change schedule for vapours', () => {
    const r = evaluateExposureAssessment(assessment())
    const text = r.ok ? r.value.cautions.join(' ') : ''
    expect(text).toContain('complete program')
    expect(text).toContain('Never use MUC for IDLH atmospheres')
    expect(text).toContain('qualified people')
    expect(text).toContain('differ between jurisdictions')
    expect(text).toContain('change schedule')
    const dust = evaluateExposureAssessment(assessment({ contaminants: [substance({ form: 'particulate' })] }))
    expect(dust.ok && dust.value.cautions.join(' ')).not.toContain('change schedule')
  })
})

describe('display rounding never flatters', () => {
  it.each([
    [10.04, 10.1, 10],
    [0.925, 0.925, 0.925],
    [1234.5, 1240, 1230],
    [99.99, 100, 99.9]
  ])('%d → up %d, down %d (our display rule, no published source: a ratio rounds up, an MUC down)', (value, up, down) => {
    expect(roundUpSignificant(value)).toBe(up)
    expect(roundDownSignificant(value)).toBe(down)
  })
})
