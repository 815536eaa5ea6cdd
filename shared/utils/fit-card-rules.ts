// When a fit card may be issued, and what its verification link says later. Pure: no Vue, no
// Nitro. A card may never make a result look better than the record behind it: a failed test has
// no card; a withdrawn, corrected or uncovered result says so on the public page.

export type RecordStatus = 'draft' | 'finished' | 'superseded' | 'withdrawn'
export type UncoveredPolicy = 'flag' | 'refuse'

/** Whether a readiness check covered the result; `not-applicable` for a test without a counter (qualitative). */
export type CoverageFlag = 'covered' | 'not-covered' | 'not-applicable'

export function coverageFlagOf(coverage: { covered: boolean } | null | undefined): CoverageFlag {
  if (!coverage) return 'not-applicable'
  return coverage.covered ? 'covered' : 'not-covered'
}

export interface CardSubject {
  status: RecordStatus | string
  passed: boolean | null
  coverage: CoverageFlag
  uncoveredResults?: UncoveredPolicy
}

export type CardDecision
  = | { issue: true, coverage: CoverageFlag }
    | { issue: false, reason: 'not-finished' | 'did-not-pass' | 'withdrawn' | 'superseded' | 'not-covered', message: string }

/** A card only for the current, finished, passing revision — and not for an uncovered one when the program refuses those. */
export function cardDecision(subject: CardSubject): CardDecision {
  if (subject.status === 'withdrawn') return { issue: false, reason: 'withdrawn', message: 'This record was withdrawn; it has no fit card.' }
  if (subject.status === 'superseded') return { issue: false, reason: 'superseded', message: 'A correction replaced this revision; the card belongs to the current revision.' }
  if (subject.status !== 'finished') return { issue: false, reason: 'not-finished', message: 'A fit card is issued once a passing test is finished.' }
  if (!subject.passed) return { issue: false, reason: 'did-not-pass', message: 'There is no fit card for a test that did not pass.' }
  if (subject.coverage === 'not-covered' && subject.uncoveredResults === 'refuse') {
    return { issue: false, reason: 'not-covered', message: 'Your program refuses results no readiness check covers, so this test gets no fit card.' }
  }
  return { issue: true, coverage: subject.coverage }
}

export const VERIFICATION_STATES = ['valid', 'expired', 'did-not-pass', 'withdrawn', 'superseded', 'not-accepted', 'not-finished'] as const
export type VerificationState = typeof VERIFICATION_STATES[number]

export interface VerificationSubject extends CardSubject {
  /** YYYY-MM-DD, the next test due. */
  dueOn: string | null
  /** YYYY-MM-DD, today in the site's time zone. */
  today: string
}

/**
 * What a card's link says about the revision it was printed for. Each state names what happened:
 * "withdrawn" only when the record was withdrawn, "superseded" when a correction replaced it,
 * "did not pass" when the test failed.
 */
export function verificationState(subject: VerificationSubject): VerificationState {
  if (subject.status === 'withdrawn') return 'withdrawn'
  if (subject.status === 'superseded') return 'superseded'
  if (subject.status !== 'finished') return 'not-finished'
  if (!subject.passed) return 'did-not-pass'
  if (subject.coverage === 'not-covered' && subject.uncoveredResults === 'refuse') return 'not-accepted'
  if (subject.dueOn && subject.dueOn < subject.today) return 'expired'
  return 'valid'
}

/** Words for the public page: a heading, a sentence, and whether the card may be relied on. */
export const VERIFICATION_STATE_TEXT: Record<VerificationState, { word: string, text: string, reliable: boolean }> = {
  'valid': { word: 'Valid', text: 'This card matches a current, passing fit test.', reliable: true },
  'expired': { word: 'Expired', text: 'The fit test on this card is past its due date. A new test is needed.', reliable: false },
  'did-not-pass': { word: 'Did not pass', text: 'The fit test behind this link did not pass. It does not show a fit with this respirator.', reliable: false },
  'withdrawn': { word: 'Withdrawn', text: 'The program withdrew the record behind this card. Do not rely on it.', reliable: false },
  'superseded': { word: 'Superseded by a correction', text: 'A correction replaced the record this card was printed from. Ask the wearer for the card of the corrected record.', reliable: false },
  'not-accepted': { word: 'Not accepted', text: 'No readiness check covered the counter used for this test, and the program does not accept such results.', reliable: false },
  'not-finished': { word: 'Not finished', text: 'The fit test behind this link was never finished.', reliable: false }
}

/** The coverage line for a card or the public page: no times, serials or names. */
export const COVERAGE_FLAG_TEXT: Record<CoverageFlag, string> = {
  'covered': 'Covered by a readiness check: the counter passed it earlier the same day.',
  'not-covered': 'Not covered: no passing readiness check of the counter was recorded earlier that day.',
  'not-applicable': 'Readiness check not applicable (qualitative test, no counter).'
}
