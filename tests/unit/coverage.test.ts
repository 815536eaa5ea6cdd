import { describe, expect, it } from 'vitest'
import { localDay } from '../../shared/utils/clock'
import { decideCoverage } from '../../shared/utils/coverage'
import type { CandidateCheck } from '../../shared/utils/coverage'

// The rule under test: a result is covered by a passing readiness check of the same counter (and
// bench rig) completed earlier the same calendar day in the site's time zone — DOMAIN.md,
// "Records and timing" (a program rule of ours, no published source for the time-zone detail).

const counterA = 'counter-a'
const counterB = 'counter-b'
const rig = 'rig-1'

function check(id: string, completedAt: string, over: Partial<CandidateCheck> = {}): CandidateCheck {
  return { id, counterId: counterA, benchRigId: null, status: 'passed', completedAt, ...over }
}

describe('localDay', () => {
  it.each([
    // Chicago is UTC−6 in January (IANA tz database).
    ['2026-01-15T05:30:00Z', 'America/Chicago', '2026-01-14'],
    ['2026-01-15T06:10:00Z', 'America/Chicago', '2026-01-15'],
    // London is UTC+1 in summer (BST).
    ['2026-07-01T23:30:00Z', 'Europe/London', '2026-07-02']
  ])('%s in %s is %s', (at, zone, day) => {
    expect(localDay(at, zone)).toBe(day)
  })
})

describe('decideCoverage', () => {
  it('covers a result after a passing check of the same counter that day', () => {
    const c = decideCoverage({ counterId: counterA, performedAt: '2026-03-10T14:00:00Z', timeZone: 'America/New_York' }, [check('k1', '2026-03-10T13:00:00Z')])
    expect(c).toMatchObject({ covered: true, reason: 'covered', checkId: 'k1' })
    expect(c.message).toMatch(/passed at 09:00/)
  })

  it('does not cover a test at 00:10 local after a check at 23:30 local the day before, though both are the same UTC date', () => {
    // Chicago, January, UTC−6: 23:30 local on the 14th = 05:30Z on the 15th; 00:10 local on the 15th = 06:10Z on the 15th.
    const c = decideCoverage(
      { counterId: counterA, performedAt: '2026-01-15T06:10:00Z', timeZone: 'America/Chicago' },
      [check('late', '2026-01-15T05:30:00Z')]
    )
    expect(c).toMatchObject({ covered: false, reason: 'no-check-that-day' })
  })

  it('covers a test when UTC dates differ but the local day is the same', () => {
    // Chicago, UTC−6: check 18:00 local (00:00Z next UTC day is not reached), test 19:30 local = 01:30Z next UTC day.
    const c = decideCoverage(
      { counterId: counterA, performedAt: '2026-01-16T01:30:00Z', timeZone: 'America/Chicago' },
      [check('evening', '2026-01-16T00:00:00Z')]
    )
    expect(c.covered).toBe(true)
  })

  it('covers after a failed check followed by a passing one', () => {
    const c = decideCoverage({ counterId: counterA, performedAt: '2026-03-10T15:00:00Z', timeZone: 'UTC' }, [
      check('failed', '2026-03-10T08:00:00Z', { status: 'failed' }),
      check('rerun', '2026-03-10T08:40:00Z')
    ])
    expect(c).toMatchObject({ covered: true, checkId: 'rerun' })
  })

  it('does not cover when the last check before the result failed', () => {
    const c = decideCoverage({ counterId: counterA, performedAt: '2026-03-10T15:00:00Z', timeZone: 'UTC' }, [
      check('morning', '2026-03-10T08:00:00Z'),
      check('noon', '2026-03-10T12:00:00Z', { status: 'failed' })
    ])
    expect(c).toMatchObject({ covered: false, reason: 'last-check-failed', checkId: 'noon' })
  })

  it('does not cover when the only check that day was completed after the result', () => {
    const c = decideCoverage({ counterId: counterA, performedAt: '2026-03-10T08:00:00Z', timeZone: 'UTC' }, [check('later', '2026-03-10T09:00:00Z')])
    expect(c).toMatchObject({ covered: false, reason: 'check-after-result', checkId: 'later' })
  })

  it('does not cover with only another counter\'s check', () => {
    const c = decideCoverage({ counterId: counterA, performedAt: '2026-03-10T15:00:00Z', timeZone: 'UTC' }, [check('other', '2026-03-10T08:00:00Z', { counterId: counterB })])
    expect(c).toMatchObject({ covered: false, reason: 'other-counter-only' })
  })

  it('does not cover a headform test when the rig\'s check was run with another counter', () => {
    const c = decideCoverage({ counterId: counterA, benchRigId: rig, performedAt: '2026-03-10T15:00:00Z', timeZone: 'UTC' }, [
      check('rig-other', '2026-03-10T08:00:00Z', { counterId: counterB, benchRigId: rig })
    ])
    expect(c).toMatchObject({ covered: false, reason: 'rig-check-other-counter' })
  })

  it('does not cover a headform test with only a counter-alone check', () => {
    const c = decideCoverage({ counterId: counterA, benchRigId: rig, performedAt: '2026-03-10T15:00:00Z', timeZone: 'UTC' }, [check('counter-only', '2026-03-10T08:00:00Z')])
    expect(c).toMatchObject({ covered: false, reason: 'no-check-that-day' })
  })

  it('covers a headform test after a passing check of the same rig and counter', () => {
    const c = decideCoverage({ counterId: counterA, benchRigId: rig, performedAt: '2026-03-10T15:00:00Z', timeZone: 'UTC' }, [
      check('rig-ok', '2026-03-10T08:00:00Z', { benchRigId: rig })
    ])
    expect(c).toMatchObject({ covered: true, checkId: 'rig-ok' })
  })

  it('ignores abandoned and unfinished checks', () => {
    const c = decideCoverage({ counterId: counterA, performedAt: '2026-03-10T15:00:00Z', timeZone: 'UTC' }, [
      check('gave-up', '2026-03-10T08:00:00Z', { status: 'abandoned' }),
      check('open', '2026-03-10T08:00:00Z', { status: 'in-progress', completedAt: null })
    ])
    expect(c.reason).toBe('no-check-that-day')
  })

  it('does not cover results made after the calibration due date, whatever the checks say', () => {
    const checks = [check('ok', '2026-03-10T08:00:00Z')]
    const result = { counterId: counterA, performedAt: '2026-03-10T15:00:00Z', timeZone: 'UTC' }
    expect(decideCoverage(result, checks, { calibrationDueOn: '2026-03-09' })).toMatchObject({ covered: false, reason: 'calibration-past-due' })
    // On the due date itself the counter is still in calibration.
    expect(decideCoverage(result, checks, { calibrationDueOn: '2026-03-10' }).covered).toBe(true)
  })

  it('judges the calibration date by the site\'s calendar day', () => {
    // 01:00 local on 1 July in London (BST, UTC+1) is 00:00Z on 1 July; 23:30Z on 30 June is already 1 July locally.
    const result = { counterId: counterA, performedAt: '2026-06-30T23:30:00Z', timeZone: 'Europe/London' }
    expect(decideCoverage(result, [check('k', '2026-06-30T23:10:00Z')], { calibrationDueOn: '2026-06-30' }).reason).toBe('calibration-past-due')
  })
})
