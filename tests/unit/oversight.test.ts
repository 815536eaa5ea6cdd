import { describe, expect, it } from 'vitest'
import { nextDueDate } from '../../shared/utils/fit-test-evaluate'
import { clearanceStanding, coveringClearance, importedDueOn, overallStatus, reminderStep, respiratorStandings, statusOfDueDate } from '../../shared/utils/oversight'
import type { ClearanceRecord, FitEvent } from '../../shared/utils/oversight'

describe('due dates, one per respirator', () => {
  // 29 CFR 1910.134(f)(2): a fit test at least every 12 months. Our rule: the same day of the
  // month, or that month's last day when the day does not exist. 29 Feb → 28 Feb (not 1 Mar),
  // because falling back never makes the interval longer than twelve months.
  it.each([
    ['2026-03-10', 12, '2027-03-10', '29 CFR 1910.134(f)(2), plain anniversary'],
    ['2024-02-29', 12, '2025-02-28', '29 CFR 1910.134(f)(2); month-end rule is ours (common practice, no published source)'],
    ['2027-02-28', 12, '2028-02-28', 'derived: the day exists in the leap year, no shift'],
    ['2026-08-31', 6, '2027-02-28', 'organization interval shorter than 12 months (f)(2); month-end rule ours'],
    ['2026-01-31', 1, '2026-02-28', 'derived from the month-end rule'],
    ['2026-12-15', 12, '2027-12-15', 'derived: year rollover']
  ])('tested %s, every %i months → due %s (%s)', (testedOn, months, due) => {
    expect(nextDueDate(testedOn, months)).toBe(due)
  })

  it('never lets an organization interval exceed 12 months — (f)(2)', () => {
    expect(importedDueOn('2026-05-01', true, 18)).toBe('2027-05-01')
    expect(importedDueOn('2026-05-01', true, 6)).toBe('2026-11-01')
    expect(importedDueOn('2026-05-01', false, 6)).toBeNull()
  })

  it.each([
    ['2026-06-01', '2026-06-02', 'overdue'],
    ['2026-06-01', '2026-06-01', 'due-soon'],
    ['2026-07-01', '2026-06-01', 'due-soon'],
    ['2026-07-02', '2026-06-01', 'current'],
    [null, '2026-06-01', 'never-tested']
  ] as const)('due %s seen on %s is %s (30-day window: common practice, no published source)', (due, today, status) => {
    expect(statusOfDueDate(due, today)).toBe(status)
  })
})

function event(over: Partial<FitEvent>): FitEvent {
  return { respiratorKey: 'half', respiratorModelId: 'half', make: 'Invented Co', model: 'H-1 half mask', respiratorClass: 'elastomeric-half-mask', size: 'M', testedOn: '2026-01-10', passed: true, dueOn: '2027-01-10', source: 'sealwright', fitTestId: 't1', ...over }
}

describe('respiratorStandings', () => {
  const assigned = [
    { respiratorModelId: 'half', make: 'Invented Co', model: 'H-1 half mask', respiratorClass: 'elastomeric-half-mask' },
    { respiratorModelId: 'full', make: 'Invented Co', model: 'F-9 full facepiece', respiratorClass: 'elastomeric-full-facepiece' },
    { respiratorModelId: 'third', make: 'Invented Co', model: 'T-3 half mask', respiratorClass: 'filtering-facepiece' }
  ]

  it('keeps one line per respirator, each with its own due date, and flags an assigned one never tested', () => {
    const list = respiratorStandings([
      event({}),
      event({ respiratorKey: 'full', respiratorModelId: 'full', model: 'F-9 full facepiece', testedOn: '2025-03-01', dueOn: '2026-03-01', fitTestId: 't2' })
    ], assigned, '2026-06-01')
    expect(list.map(s => [s.model, s.status, s.dueOn])).toEqual([
      ['F-9 full facepiece', 'overdue', '2026-03-01'],
      ['H-1 half mask', 'current', '2027-01-10'],
      ['T-3 half mask', 'never-tested', null]
    ])
    expect(overallStatus(list)).toBe('overdue')
  })

  it('shows a failure newer than the last pass as failed, never as the older pass', () => {
    const [half] = respiratorStandings([event({}), event({ testedOn: '2026-04-01', passed: false, dueOn: null, fitTestId: 't3' })], [], '2026-06-01')
    expect(half!.status).toBe('failed')
    expect(half!.lastPass?.fitTestId).toBe('t1')
  })

  it('lets a newer pass in another size replace the older one', () => {
    const [half] = respiratorStandings([event({}), event({ testedOn: '2026-05-01', size: 'L', dueOn: '2027-05-01', fitTestId: 't4' })], [], '2026-06-01')
    expect([half!.size, half!.dueOn]).toEqual(['L', '2027-05-01'])
  })

  it('counts imported history for the due date, marked as imported', () => {
    const [half] = respiratorStandings([event({ source: 'imported', fitTestId: null, testedOn: '2025-09-01', dueOn: '2026-09-01' })], [], '2026-06-01')
    expect(half!.status).toBe('current')
    expect(half!.lastPass?.source).toBe('imported')
  })
})

const clearance = (over: Partial<ClearanceRecord>): ClearanceRecord => ({ id: 'c1', clearedOn: '2026-01-01', validUntil: '2027-01-01', clearedBy: 'Invented Occupational Clinic', respiratorClasses: ['elastomeric-half-mask'], restrictions: null, ...over })

describe('medical clearance coverage — 29 CFR 1910.134(e)(1): evaluation before fit testing', () => {
  it.each([
    ['2026-06-01', 'elastomeric-half-mask', 'c1', 'inside the dates, class named'],
    ['2027-01-01', 'elastomeric-half-mask', 'c1', 'valid-until day is included (our rule: "valid until" reads inclusive)'],
    ['2027-01-02', 'elastomeric-half-mask', null, 'lapsed the day after'],
    ['2025-12-31', 'elastomeric-half-mask', null, 'not before it was given'],
    ['2026-06-01', 'elastomeric-full-facepiece', null, 'another class is not covered']
  ])('on %s for %s → %s (%s)', (day, cls, expected) => {
    expect(coveringClearance([clearance({})], cls, day)?.id ?? null).toBe(expected)
  })

  it('takes the record that lasts longest when several cover', () => {
    const records = [clearance({}), clearance({ id: 'c2', validUntil: null, respiratorClasses: ['elastomeric-half-mask', 'elastomeric-full-facepiece'] })]
    expect(coveringClearance(records, 'elastomeric-half-mask', '2026-06-01')?.id).toBe('c2')
  })

  it.each([
    ['2026-06-01', 'current'],
    ['2026-12-10', 'lapsing'],
    ['2027-01-02', 'lapsed']
  ] as const)('standing on %s is %s', (today, status) => {
    expect(clearanceStanding([clearance({})], today).status).toBe(status)
  })

  it('says "none" when nothing is on file', () => {
    expect(clearanceStanding([], '2026-06-01').status).toBe('none')
  })
})

describe('reminderStep (program settings; no published source)', () => {
  const settings = { leadDays: 30, repeatDays: 7 }
  it.each([
    ['2026-07-01', '2026-05-31', null],
    ['2026-07-01', '2026-06-01', 'ahead'],
    ['2026-07-01', '2026-07-01', 'ahead'],
    ['2026-07-01', '2026-07-02', 'overdue-1'],
    ['2026-07-01', '2026-07-08', 'overdue-1'],
    ['2026-07-01', '2026-07-09', 'overdue-2']
  ])('due %s, today %s → %s', (due, today, step) => {
    expect(reminderStep(due, today, settings)).toBe(step)
  })
})
