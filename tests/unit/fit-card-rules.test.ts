import { describe, expect, it } from 'vitest'
import { cardDecision, coverageFlagOf, verificationState } from '../../shared/utils/fit-card-rules'
import type { CardSubject, VerificationState } from '../../shared/utils/fit-card-rules'
import { recordCitations } from '../../shared/utils/jurisdiction'

// A card or its link may never show a result more favourably than the record: issue 8, items 2
// and 3 (program rules of ours, no published source). Coverage as in DOMAIN.md "Records and timing".

describe('cardDecision', () => {
  it.each<[string, CardSubject, boolean, string?]>([
    ['a finished, covered pass', { status: 'finished', passed: true, coverage: 'covered' }, true],
    ['an uncovered pass when the program only flags', { status: 'finished', passed: true, coverage: 'not-covered', uncoveredResults: 'flag' }, true],
    ['a qualitative pass (no counter)', { status: 'finished', passed: true, coverage: 'not-applicable', uncoveredResults: 'refuse' }, true],
    ['a failed test', { status: 'finished', passed: false, coverage: 'covered' }, false, 'did-not-pass'],
    ['an uncovered pass when the program refuses them', { status: 'finished', passed: true, coverage: 'not-covered', uncoveredResults: 'refuse' }, false, 'not-covered'],
    ['a draft', { status: 'draft', passed: true, coverage: 'covered' }, false, 'not-finished'],
    ['a withdrawn record', { status: 'withdrawn', passed: true, coverage: 'covered' }, false, 'withdrawn'],
    ['a superseded revision', { status: 'superseded', passed: true, coverage: 'covered' }, false, 'superseded']
  ])('%s → card %s', (_label, subject, issue, reason) => {
    const decision = cardDecision(subject)
    expect(decision.issue).toBe(issue)
    if (!decision.issue) expect(decision.reason).toBe(reason)
  })

  it('carries the coverage flag onto an issued card', () => {
    expect(cardDecision({ status: 'finished', passed: true, coverage: 'not-covered', uncoveredResults: 'flag' })).toEqual({ issue: true, coverage: 'not-covered' })
  })
})

describe('verificationState', () => {
  const base = { status: 'finished', passed: true, coverage: 'covered', dueOn: '2027-11-20', today: '2026-12-01' } as const
  it.each<[string, Partial<typeof base> & Record<string, unknown>, VerificationState]>([
    ['a current pass', {}, 'valid'],
    ['a pass past its due date', { today: '2027-11-21' }, 'expired'],
    ['a pass on its due date', { today: '2027-11-20' }, 'valid'],
    ['a test that did not pass — never "withdrawn"', { passed: false }, 'did-not-pass'],
    ['a withdrawn record', { status: 'withdrawn' }, 'withdrawn'],
    ['a failed test later withdrawn', { status: 'withdrawn', passed: false }, 'withdrawn'],
    ['a revision replaced by a correction', { status: 'superseded' }, 'superseded'],
    ['an uncovered pass, program refuses', { coverage: 'not-covered', uncoveredResults: 'refuse' }, 'not-accepted'],
    ['an uncovered pass, program flags', { coverage: 'not-covered', uncoveredResults: 'flag' }, 'valid'],
    ['a draft', { status: 'draft' }, 'not-finished']
  ])('%s → %s', (_label, over, state) => {
    expect(verificationState({ ...base, ...over } as Parameters<typeof verificationState>[0])).toBe(state)
  })

  it('flags coverage from a decided coverage, or not applicable without a counter', () => {
    expect(coverageFlagOf({ covered: true })).toBe('covered')
    expect(coverageFlagOf({ covered: false })).toBe('not-covered')
    expect(coverageFlagOf(null)).toBe('not-applicable')
  })
})

describe('recordCitations', () => {
  it('cites 29 CFR 1910.134(m)(2) for a US record', () => {
    // DOMAIN.md "Jurisdiction": US records per 29 CFR 1910.134(m)(2).
    expect(recordCitations('us-osha')?.record).toBe('29 CFR 1910.134(m)(2)')
  })

  it('cites HSE INDG479 and HSG53 for a UK record, and never (m)(2)', () => {
    // DOMAIN.md "Jurisdiction": UK fit testing per HSE INDG479, protection factors per HSG53.
    const uk = recordCitations('uk-hse')!
    expect(uk.record).toMatch(/INDG479/)
    expect(uk.fitTesting).toMatch(/INDG479/)
    expect(uk.protectionFactors).toBe('HSE HSG53')
    expect(JSON.stringify(uk)).not.toMatch(/1910|\(m\)\(2\)/)
  })

  it('cites nothing for an unknown rule set rather than another country\'s law', () => {
    expect(recordCitations('somewhere-else')).toBeNull()
  })
})
