// Leaf modules of the computation module, not its index: every page loads this file (the layout
// uses it), and the index would bring the statistics and CSV libraries along.
import { formatFitFactor } from '#shared/utils/compute/fit-factor-text'
import { findBuiltInProtocol } from '#shared/utils/compute/protocol-data'
import { findRespiratorClass } from '#shared/utils/compute/respirator-classes'
import { formatCalendarDay, formatEventDay, formatEventTime } from '#shared/utils/clock'

export const PROGRAM_TIME_ZONE_KEY = 'program-time-zone'
/** Whose program the zone above is (a user id), so signing in as someone else reads it again. */
export const PROGRAM_TIME_ZONE_FOR_KEY = 'program-time-zone-for'

/**
 * The zone of an event that carries no site of its own: the program's first site, set when a page
 * is rendered (app/plugins/00.page-start.server.ts) or by the default layout (useProgramClock).
 * Outside a Nuxt app (tests) it is UTC, named as such.
 */
function programZone(): string | undefined {
  if (!tryUseNuxtApp()) return undefined
  return useState<string | null>(PROGRAM_TIME_ZONE_KEY, () => null).value ?? undefined
}

/** A day: "2 Dec 2026". A stored calendar day is that day; an instant is its day in the site's zone. */
export function formatDate(value: string | Date | null | undefined, timeZone?: string | null) {
  if (typeof value === 'string' && /^\d{4}-\d{2}-\d{2}$/.test(value)) return formatCalendarDay(value)
  return formatEventDay(value, timeZone || programZone())
}

/** An instant: "2 Dec 2026, 06:06 GMT", in the site's zone with the zone named. */
export function formatDateTime(value: string | Date | null | undefined, timeZone?: string | null) {
  return formatEventTime(value, timeZone || programZone())
}

export function protocolName(key: string) {
  if (key === 'qualitative-app-a') return 'Qualitative protocol (29 CFR 1910.134 App. A)'
  return findBuiltInProtocol(key)?.name ?? key
}

export function respiratorClassLabel(key: string) {
  return findRespiratorClass(key)?.label ?? key
}

/** A fit factor as the computation module writes it ("66.0", "> 2074"): cut, never rounded up. */
export function formatFactor(value: number | null | undefined, isLowerBound = false) {
  if (value === null || value === undefined) return '—'
  return formatFitFactor({ value, isLowerBound })
}
