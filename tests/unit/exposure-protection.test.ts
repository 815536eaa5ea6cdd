import { describe, expect, it } from 'vitest'
import { selectionClassesFor } from '#shared/utils/compute'
import { protectionFor } from '#shared/utils/exposure-protection'
import type { FitRecordSummary } from '#shared/utils/exposure-protection'
import { readCalculatorNumber } from '#shared/utils/exposure-number'

const us = (...keys: string[]) => selectionClassesFor('us-osha').filter(c => keys.includes(c.key))
const today = '2026-06-01'

function test(over: Partial<FitRecordSummary>): FitRecordSummary {
  return { id: 't1', respiratorClass: 'elastomeric-half-mask', respirator: 'Corvid Safety CV-2', size: 'M', performedOn: '2026-01-10', dueOn: '2027-01-10', ...over }
}

describe('who is protected for a job', () => {
  it('a current passing fit test on a chosen class protects', () => {
    const r = protectionFor({ allowedClasses: us('elastomeric-half-mask'), passingFitTests: [test({})], today })
    expect(r.protected).toBe(true)
    expect(r.gap).toBeNull()
    expect(r.conditions[0]!.recordId).toBe('t1')
  })

  it('names the gap when fitted for a half mask and the job needs a full facepiece', () => {
    const r = protectionFor({ allowedClasses: us('elastomeric-full-facepiece'), passingFitTests: [test({})], today })
    expect(r.protected).toBe(false)
    expect(r.gap).toBe('Fitted for a half mask (Corvid Safety CV-2); this job needs a full facepiece: elastomeric full facepiece (air-purifying).')
  })

  it('an expired fit test on the right class is a gap, not a pass', () => {
    const r = protectionFor({ allowedClasses: us('elastomeric-half-mask'), passingFitTests: [test({ dueOn: '2026-05-31' })], today })
    expect(r.protected).toBe(false)
    expect(r.gap).toContain('expired on 2026-05-31')
  })

  it('a fit test due today still counts (due date is the last valid day)', () => {
    expect(protectionFor({ allowedClasses: us('elastomeric-half-mask'), passingFitTests: [test({ dueOn: today })], today }).protected).toBe(true)
  })

  it('nobody fitted: says what the job needs', () => {
    const r = protectionFor({ allowedClasses: us('elastomeric-full-facepiece', 'papr-full-facepiece'), passingFitTests: [], today })
    expect(r.gap).toBe('No current passing fit test; this job needs a full facepiece: elastomeric full facepiece (air-purifying) or powered air-purifying, tight-fitting full facepiece.')
  })

  it('a loose-fitting class needs no fit test, and says so', () => {
    const r = protectionFor({ allowedClasses: us('papr-loose-fitting-facepiece'), passingFitTests: [], today })
    expect(r.protected).toBe(true)
    expect(r.notes[0]).toContain('needs no fit test')
  })

  it('a UK filtering facepiece match carries the filter-grade note', () => {
    const ffp3 = selectionClassesFor('uk-hse').filter(c => c.key === 'uk-ffp3')
    const r = protectionFor({ allowedClasses: ffp3, passingFitTests: [test({ respiratorClass: 'filtering-facepiece' })], today })
    expect(r.protected).toBe(true)
    expect(r.notes.join(' ')).toContain('filter grade')
  })
})

describe('numbers typed into the calculator', () => {
  it.each([
    ['12,500', 12500],
    ['1 250.5', 1250.5],
    ['1.2E+03', 1200],
    ['', null]
  ])('%s reads as %s', (text, value) => {
    const r = readCalculatorNumber(text)
    expect(r.ok && r.value).toBe(value)
  })

  it.each(['1,5', '12 ppm', '0x10', 'Infinity', 'NaN', '5%'])('%s is refused with a message', (text) => {
    const r = readCalculatorNumber(text)
    expect(r.ok).toBe(false)
  })
})

describe('the calculator form as typed', () => {
  it('reads every typed number once, marks what it cannot read, and round-trips a stored input', async () => {
    const { emptySubstance, readCalculatorDraft, draftFromInput } = await import('#shared/utils/exposure-draft')
    const substance = { ...emptySubstance(), name: 'Solvent A', exposure: '12,500', limit: '1,5', idlh: '' }
    const read = readCalculatorDraft({ contaminants: [substance], additiveMixture: true, oxygenDeficient: false })
    expect(read.readErrors['contaminants.0.limit.value']).toContain('ambiguous')
    expect(read.asRead['contaminants.0.exposure.value']).toBe('12 500')
    const c = read.input.contaminants[0]!
    expect(c.exposure).toEqual({ mode: 'single', value: 12500, unit: 'ppm' })
    expect(c.idlh).toBeNull()
    const back = draftFromInput(read.input)
    expect(back.contaminants[0]!.exposure).toBe('12500')
  })
})
