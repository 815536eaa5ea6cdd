// Whether a passing readiness check covers a result (fit test or headform test): same counter (and
// same bench rig for a headform test), passed, completed earlier the same calendar day in the
// site's time zone (DOMAIN.md, "Records and timing"). Pure: no Vue, no Nitro.

import { formatCalendarDay, localDay } from './clock'
import { dateTimeFormat } from './intl-cache'

export const COVERAGE_REASONS = [
  'covered',
  'no-check-that-day',
  'last-check-failed',
  'other-counter-only',
  'check-after-result',
  'rig-check-other-counter',
  'calibration-past-due'
] as const
export type CoverageReason = typeof COVERAGE_REASONS[number]

export interface Coverage {
  covered: boolean
  reason: CoverageReason
  /** A sentence a fit tester understands. */
  message: string
  checkId?: string
  completedAt?: string
}

export interface CoverageResult {
  counterId: string
  benchRigId?: string | null
  performedAt: Date | string
  /** IANA time zone of the site where the result was made. */
  timeZone: string
}

export interface CandidateCheck {
  id: string
  counterId: string
  benchRigId: string | null
  /** Only 'passed' and 'failed' checks have ended with a verdict; others are ignored. */
  status: string
  completedAt: Date | string | null
}

export interface CoverageCounter {
  /** YYYY-MM-DD; results on a later calendar day are flagged. */
  calibrationDueOn: string | null
}

function localTime(at: Date, timeZone: string): string {
  // The time with its zone named ("06:06 GMT"), the same clock every page uses (shared/utils/clock.ts).
  return dateTimeFormat('en-GB', { timeZone, hour: '2-digit', minute: '2-digit', hourCycle: 'h23', timeZoneName: 'short' }).format(at)
}

const toDate = (v: Date | string) => (v instanceof Date ? v : new Date(v))

export function decideCoverage(result: CoverageResult, checks: readonly CandidateCheck[], counter?: CoverageCounter | null): Coverage {
  const performedAt = toDate(result.performedAt)
  const day = localDay(performedAt, result.timeZone)
  const rig = result.benchRigId ?? null

  if (counter?.calibrationDueOn && day > counter.calibrationDueOn) {
    return {
      covered: false,
      reason: 'calibration-past-due',
      message: `The counter's calibration was due on ${formatCalendarDay(counter.calibrationDueOn)}; results made after that date are not covered until it is calibrated again.`
    }
  }

  const thatDay = checks
    .filter(c => (c.status === 'passed' || c.status === 'failed') && c.completedAt !== null)
    .map(c => ({ ...c, completedAt: toDate(c.completedAt!) }))
    .filter(c => localDay(c.completedAt, result.timeZone) === day)

  // A headform test needs its rig's check; a fit test accepts any check of its counter
  // (a rig check runs the paired counter's steps too).
  const relevant = rig === null
    ? thatDay.filter(c => c.counterId === result.counterId)
    : thatDay.filter(c => c.benchRigId === rig && c.counterId === result.counterId)

  if (relevant.length === 0) {
    if (rig !== null && thatDay.some(c => c.benchRigId === rig)) {
      return { covered: false, reason: 'rig-check-other-counter', message: 'The bench rig\'s readiness check that day was run with another counter, not the one used for this result.' }
    }
    if (rig === null && thatDay.length > 0) {
      return { covered: false, reason: 'other-counter-only', message: 'Readiness checks that day were run on another counter only, not on the counter used for this result.' }
    }
    return {
      covered: false,
      reason: 'no-check-that-day',
      message: rig === null
        ? `No readiness check of this counter was completed on ${formatCalendarDay(day)}, the site's calendar day.`
        : `No readiness check of this bench rig was completed on ${formatCalendarDay(day)}, the site's calendar day.`
    }
  }

  const earlier = relevant.filter(c => c.completedAt.getTime() <= performedAt.getTime())
  if (earlier.length === 0) {
    const first = relevant.reduce((a, b) => (a.completedAt <= b.completedAt ? a : b))
    return {
      covered: false,
      reason: 'check-after-result',
      message: `The readiness check that day was completed at ${localTime(first.completedAt, result.timeZone)}, after this result; run it before testing.`,
      checkId: first.id,
      completedAt: first.completedAt.toISOString()
    }
  }

  const last = earlier.reduce((a, b) => (a.completedAt >= b.completedAt ? a : b))
  const when = localTime(last.completedAt, result.timeZone)
  if (last.status !== 'passed') {
    return {
      covered: false,
      reason: 'last-check-failed',
      message: `The last readiness check before this result (${when}) failed; pass a new check before testing.`,
      checkId: last.id,
      completedAt: last.completedAt.toISOString()
    }
  }
  return {
    covered: true,
    reason: 'covered',
    message: `Readiness check passed at ${when}, earlier the same day.`,
    checkId: last.id,
    completedAt: last.completedAt.toISOString()
  }
}
