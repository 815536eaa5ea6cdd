import { describe, expect, it } from 'vitest'
import { selectionClassesFor } from '#shared/utils/compute'
import { protectionFor } from '#shared/utils/exposure-protection'
import { readCalculatorNumber } from '#shared/utils/exposure-number'
import { respiratorStandings } from '#shared/utils/oversight'
import type { ClearanceRecord, FitEvent } from '#shared/utils/oversight'

const us = (...keys: string[]) => selectionClassesFor('us-osha').filter(c => keys.includes(c.key))
const today = '2026-06-01'

// Invented demo-style records; dates chosen around `today`.
function event(over: Partial<FitEvent>): FitEvent {
  return {
    respiratorKey: 'model-cv2', respiratorModelId: 'model-cv2', make: 'Corvid Safety', model: 'CV-2', respiratorClass: 'elastomeric-half-mask',
    size: 'M', testedOn: '2026-01-10', passed: true, dueOn: '2027-01-10', source: 'sealwright', fitTestId: 't1', ...over
  }
}
function clearance(over: Partial<ClearanceRecord> = {}): ClearanceRecord {
  return { id: 'c1', clearedOn: '2026-01-02', validUntil: '2027-01-02', clearedBy: 'Lowfield Occupational Health (invented)', respiratorClasses: ['elastomeric-half-mask', 'elastomeric-full-facepiece', 'filtering-facepiece'], restrictions: null, ...over }
}
const cleared = [clearance()]
const standings = (...events: FitEvent[]) => respiratorStandings(events, [], today)

describe('who is protected for a job', () => {
  it('a current passing fit test on a chosen class, with a current clearance covering it, protects', () => {
    const r = protectionFor({ allowedClasses: us('elastomeric-half-mask'), respirators: standings(event({})), clearances: cleared, today })
    expect(r.protected).toBe(true)
    expect(r.gap).toBeNull()
    expect(r.conditions.map(c => [c.key, c.met])).toEqual([['fit-test', true], ['medical-clearance', true]])
    expect(r.conditions[0]!.recordId).toBe('t1')
  })

  it('names the gap when fitted for a half mask and the job needs a full facepiece', () => {
    const r = protectionFor({ allowedClasses: us('elastomeric-full-facepiece'), respirators: standings(event({})), clearances: cleared, today })
    expect(r.protected).toBe(false)
    expect(r.gap).toBe('Fitted for a half mask (Corvid Safety CV-2); this job needs a full facepiece: elastomeric full facepiece (air-purifying).')
  })

  it('an expired fit test on the right class is a gap, not a pass', () => {
    const r = protectionFor({ allowedClasses: us('elastomeric-half-mask'), respirators: standings(event({ dueOn: '2026-05-31' })), clearances: cleared, today })
    expect(r.protected).toBe(false)
    expect(r.gap).toContain('expired on 2026-05-31')
  })

  it('a fit test due today still counts (due date is the last valid day)', () => {
    expect(protectionFor({ allowedClasses: us('elastomeric-half-mask'), respirators: standings(event({ dueOn: today })), clearances: cleared, today }).protected).toBe(true)
  })

  it('nobody fitted: says what the job needs', () => {
    const r = protectionFor({ allowedClasses: us('elastomeric-full-facepiece', 'papr-full-facepiece'), respirators: [], clearances: [clearance({ respiratorClasses: ['elastomeric-full-facepiece', 'papr-full-facepiece'] })], today })
    expect(r.gap).toBe('No current passing fit test; this job needs a full facepiece: elastomeric full facepiece (air-purifying) or powered air-purifying, tight-fitting full facepiece.')
  })

  it('a loose-fitting class needs no fit test, and says so', () => {
    const r = protectionFor({ allowedClasses: us('papr-loose-fitting-facepiece'), respirators: [], clearances: [clearance({ respiratorClasses: ['papr-loose-fitting-facepiece'] })], today })
    expect(r.protected).toBe(true)
    expect(r.notes[0]).toContain('needs no fit test')
  })

  it('a UK filtering facepiece match carries the filter-grade note', () => {
    const ffp3 = selectionClassesFor('uk-hse').filter(c => c.key === 'uk-ffp3')
    const r = protectionFor({ allowedClasses: ffp3, respirators: standings(event({ respiratorClass: 'filtering-facepiece' })), clearances: cleared, today })
    expect(r.protected).toBe(true)
    expect(r.notes.join(' ')).toContain('filter grade')
  })
})

describe('a later failed fit test cancels an earlier pass (oversight rules, one line per respirator model)', () => {
  it('pass in January, fail in May on the same model: not protected, the failure named and relied on', () => {
    const r = protectionFor({
      allowedClasses: us('elastomeric-half-mask'),
      respirators: standings(event({}), event({ testedOn: '2026-05-04', passed: false, dueOn: null, fitTestId: 't2' })),
      clearances: cleared, today
    })
    expect(r.protected).toBe(false)
    expect(r.gap).toBe('Latest fit test on Corvid Safety CV-2 (2026-05-04) did not pass. The earlier pass of 2026-01-10 no longer counts. This job needs a half mask: elastomeric half mask: retest.')
    expect(r.conditions[0]!.recordId).toBe('t2')
  })

  it('a pass after the failure restores protection', () => {
    const r = protectionFor({
      allowedClasses: us('elastomeric-half-mask'),
      respirators: standings(event({ testedOn: '2026-05-04', passed: false, dueOn: null, fitTestId: 't2' }), event({ testedOn: '2026-05-20', dueOn: '2027-05-20', fitTestId: 't3' })),
      clearances: cleared, today
    })
    expect(r.protected).toBe(true)
    expect(r.conditions[0]!.recordId).toBe('t3')
  })

  it('a failure on another model of the same class does not cancel this model\'s pass', () => {
    const r = protectionFor({
      allowedClasses: us('elastomeric-half-mask'),
      respirators: standings(event({}), event({ respiratorKey: 'model-other', respiratorModelId: 'model-other', model: 'HX-4', testedOn: '2026-05-04', passed: false, dueOn: null, fitTestId: 't9' })),
      clearances: cleared, today
    })
    expect(r.protected).toBe(true)
    expect(r.conditions[0]!.recordId).toBe('t1')
  })
})

describe('medical clearance: a current record covering the class worn (29 CFR 1910.134(e)(1))', () => {
  const fullFace = event({ respiratorKey: 'model-ff', respiratorModelId: 'model-ff', model: 'FF-7', respiratorClass: 'elastomeric-full-facepiece', fitTestId: 'tf' })

  it('no clearance record: not protected, the gap names the facepiece', () => {
    const r = protectionFor({ allowedClasses: us('elastomeric-full-facepiece'), respirators: standings(fullFace), clearances: [], today })
    expect(r.protected).toBe(false)
    expect(r.gap).toBe('No current medical clearance for a full facepiece.')
    expect(r.conditions[0]!.met).toBe(true)
  })

  it('a clearance for half masks only does not cover a full facepiece', () => {
    const r = protectionFor({ allowedClasses: us('elastomeric-full-facepiece'), respirators: standings(fullFace), clearances: [clearance({ respiratorClasses: ['elastomeric-half-mask'] })], today })
    expect(r.gap).toBe('No current medical clearance for a full facepiece: the clearance on file covers a half mask only.')
  })

  it('a lapsed clearance is named with its end date; valid through its last day', () => {
    const lapsed = protectionFor({ allowedClasses: us('elastomeric-full-facepiece'), respirators: standings(fullFace), clearances: [clearance({ validUntil: '2026-05-31' })], today })
    expect(lapsed.gap).toBe('No current medical clearance for a full facepiece: the last one lapsed on 2026-05-31.')
    const lastDay = protectionFor({ allowedClasses: us('elastomeric-full-facepiece'), respirators: standings(fullFace), clearances: [clearance({ validUntil: today })], today })
    expect(lastDay.protected).toBe(true)
  })

  it('both gaps are named when neither fit nor clearance holds', () => {
    const r = protectionFor({ allowedClasses: us('elastomeric-full-facepiece'), respirators: [], clearances: [], today })
    expect(r.gap).toBe('No current passing fit test; this job needs a full facepiece: elastomeric full facepiece (air-purifying). No current medical clearance for a full facepiece.')
  })

  it('fitted on two allowed models, cleared for one: the covered one is relied on', () => {
    const papr = event({ respiratorKey: 'model-p', respiratorModelId: 'model-p', model: 'PF-1', respiratorClass: 'papr-full-facepiece', dueOn: '2027-03-01', fitTestId: 'tp' })
    const r = protectionFor({ allowedClasses: us('elastomeric-full-facepiece', 'papr-full-facepiece'), respirators: standings(fullFace, papr), clearances: [clearance({ respiratorClasses: ['elastomeric-full-facepiece'] })], today })
    expect(r.protected).toBe(true)
    expect(r.conditions[0]!.recordId).toBe('tf')
  })

  it('restrictions are pointed to, not repeated', () => {
    const r = protectionFor({ allowedClasses: us('elastomeric-half-mask'), respirators: standings(event({})), clearances: [clearance({ restrictions: 'invented restriction text' })], today })
    expect(r.protected).toBe(true)
    expect(r.notes.join(' ')).toContain('carries restrictions')
    expect(JSON.stringify(r)).not.toContain('invented restriction text')
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

describe('the calculator reads with the organization\'s decimal mark', () => {
  // The comma rules are the mirror image of the point rules (DOMAIN.md "Typing numbers").
  it.each([
    ['0,5', 0.5, 'DOMAIN.md "Typing numbers": comma is the decimal mark'],
    ['1.250,5', 1250.5, 'DOMAIN.md "Typing numbers": point groups thousands in threes'],
    ['12.500', 12500, 'DOMAIN.md "Typing numbers": point groups thousands in threes'],
    ['81,25', 81.25, '29 CFR 1910.1000(d)(1)(i) worked example, written with a comma']
  ])('with a comma, %s reads as %s (%s)', (text, value) => {
    const r = readCalculatorNumber(text, 'comma')
    expect(r.ok && r.value).toBe(value)
  })

  it.each(['1.5', '0.25'])('with a comma, %s is refused as ambiguous rather than read as a larger number', (text) => {
    const r = readCalculatorNumber(text, 'comma')
    expect(r.ok).toBe(false)
    expect(!r.ok && r.message).toContain('ambiguous')
  })

  it('a whole form typed with commas reads, and a stored input comes back written with commas', async () => {
    const { emptySubstance, readCalculatorDraft, draftFromInput } = await import('#shared/utils/exposure-draft')
    // 29 CFR 1910.1000(d)(1)(i): 2 h at 150 ppm, 2 h at 75 ppm, 4 h at 50 ppm; hours typed with a comma.
    const substance = {
      ...emptySubstance(), name: 'Solvent A', mode: 'segments' as const, limit: '100',
      segments: [{ concentration: '150', hours: '2,0' }, { concentration: '75', hours: '2' }, { concentration: '50', hours: '4,0' }]
    }
    const draft = { contaminants: [substance], additiveMixture: true, oxygenDeficient: false }
    const read = readCalculatorDraft(draft, 'comma')
    expect(read.readErrors).toEqual({})
    const exposure = read.input.contaminants[0]!.exposure
    expect(exposure.mode === 'segments' && exposure.segments.map(s => s.hours)).toEqual([2, 2, 4])
    // The same text under a point is refused where it would otherwise change meaning.
    const asPoint = readCalculatorDraft({ ...draft, contaminants: [{ ...substance, segments: [{ concentration: '150', hours: '0,5' }] }] }, 'point')
    expect(asPoint.readErrors['contaminants.0.exposure.segments.0.hours']).toContain('ambiguous')

    const single = readCalculatorDraft({ ...draft, contaminants: [{ ...emptySubstance(), exposure: '81,25', limit: '100' }] }, 'comma')
    const back = draftFromInput(single.input, 'comma')
    expect(back.contaminants[0]!.exposure).toBe('81,25')
    expect(readCalculatorDraft(back, 'comma').input.contaminants[0]!.exposure).toEqual({ mode: 'single', value: 81.25, unit: 'ppm' })
  })
})
