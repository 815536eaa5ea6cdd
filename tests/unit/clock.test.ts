import { describe, expect, it } from 'vitest'
import { formatCalendarDay, formatEventDay, formatEventTime, latestDay } from '#shared/utils/clock'
import { DEFAULT_COUNTER_TEMPLATE, DEFAULT_TOLERANCE_SOURCE, toleranceSource } from '#shared/utils/readiness-defaults'

describe('one clock', () => {
  // Zone offsets from the IANA time-zone database as the platform ships it (common practice); en-GB
  // names zones it has no British abbreviation for by their offset ("GMT-6"), which cannot be misread.
  it.each([
    ['2026-12-02T06:06:00Z', 'Europe/London', '2 Dec 2026, 06:06 GMT'],
    ['2026-12-02T13:06:00Z', 'America/Chicago', '2 Dec 2026, 07:06 GMT-6'],
    ['2026-07-02T13:06:00Z', 'Europe/London', '2 Jul 2026, 14:06 BST'],
    ['2026-12-02T02:30:00Z', 'America/New_York', '1 Dec 2026, 21:30 GMT-5']
  ])('shows %s in %s as %s', (instant, zone, shown) => {
    expect(formatEventTime(instant, zone)).toBe(shown)
  })

  it('names the same instant the same way on every page, whatever the viewer\'s zone', () => {
    expect(formatEventTime(new Date('2026-12-02T06:06:00Z'), 'Europe/London')).toBe(formatEventTime('2026-12-02T06:06:00Z', 'Europe/London'))
  })

  it('gives the day of an event in the site\'s zone, not in UTC', () => {
    expect(formatEventDay('2026-12-02T02:30:00Z', 'America/New_York')).toBe('1 Dec 2026')
    expect(formatEventDay('2026-12-02T02:30:00Z', 'Europe/London')).toBe('2 Dec 2026')
  })

  it('keeps a stored calendar day the same day in every zone', () => {
    expect(formatCalendarDay('2027-11-20')).toBe('20 Nov 2027')
    expect(formatEventDay('2027-11-20', 'Pacific/Kiritimati')).toBe('20 Nov 2027')
  })

  it('says UTC rather than guessing when the zone is unknown, and a dash for nothing', () => {
    expect(formatEventTime('2026-12-02T06:06:00Z', 'Not/AZone')).toBe('2 Dec 2026, 06:06 UTC')
    expect(formatEventTime(null, 'Europe/London')).toBe('—')
    expect(formatEventTime('not a date', 'Europe/London')).toBe('—')
  })
})

describe('the source beside a readiness tolerance', () => {
  it('labels the default zero and room-air tolerances as common practice with no published source', () => {
    const zero = DEFAULT_COUNTER_TEMPLATE.steps.find(s => s.name === 'Filtered-air zero')!
    const room = DEFAULT_COUNTER_TEMPLATE.steps.find(s => s.name === 'Room air reading')!
    // zero ≤ 1 /cm³ and room air ≥ 1,000 /cm³: common practice (no published source).
    expect(zero.rule).toEqual({ kind: 'at-most', max: 1, unit: 'particles/cm³' })
    expect(room.rule).toEqual({ kind: 'at-least', min: 1000, unit: 'particles/cm³' })
    for (const step of [zero, room]) {
      expect(toleranceSource(step)).toContain(DEFAULT_TOLERANCE_SOURCE)
      expect(toleranceSource(step)).toMatch(/instrument maker's instructions govern/)
    }
  })

  it('says a changed tolerance was set by the program, and a pass-or-fail step has none', () => {
    expect(toleranceSource({ name: 'Filtered-air zero', rule: { kind: 'at-most', max: 2, unit: 'particles/cm³' } })).toMatch(/set by your program/)
    expect(toleranceSource({ name: 'Look over the counter', rule: { kind: 'pass-fail' } })).toBeNull()
  })
})

describe('a program\'s today', () => {
  // Offsets from the IANA time-zone database (Pacific/Kiritimati UTC+14, Pacific/Auckland UTC+13 in
  // its December summer, America/New_York UTC-5 in winter); the rule — a due date has passed once it
  // has passed at any site — is common practice (no published source).
  it.each([
    ['2026-12-02T12:00:00Z', [], '2026-12-02'],
    ['2026-12-02T12:00:00Z', ['America/New_York'], '2026-12-02'],
    ['2026-12-02T03:00:00Z', ['America/New_York'], '2026-12-02'],
    ['2026-12-02T12:00:00Z', ['Pacific/Kiritimati'], '2026-12-03'],
    ['2026-12-02T09:59:00Z', ['Pacific/Kiritimati'], '2026-12-02'],
    ['2026-12-02T11:30:00Z', ['America/New_York', 'Pacific/Auckland'], '2026-12-03'],
    ['2026-12-02T12:00:00Z', ['Not/AZone', 'Pacific/Kiritimati'], '2026-12-03']
  ] as const)('at %s with sites in %j it is %s', (now, zones, day) => {
    expect(latestDay(new Date(now), zones)).toBe(day)
  })
})
