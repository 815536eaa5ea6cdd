/**
 * The one clock of every page, e-mail and export: an event is shown in its site's time zone with
 * the zone named ("2 Dec 2026, 06:06 GMT"), a date in one format ("2 Dec 2026"). A calendar date
 * that was stored as a day (a due date, a clearance) is a day everywhere and never shifts with a
 * zone. The zone arithmetic is the platform's own (Intl with the IANA database), never ours.
 */

import { dateTimeFormat } from './intl-cache'

const CALENDAR_DAY = /^\d{4}-\d{2}-\d{2}$/

/** The zone used when a page has no site of its own to name. */
export const FALLBACK_TIME_ZONE = 'UTC'

const DAY_PARTS: Intl.DateTimeFormatOptions = { day: 'numeric', month: 'short', year: 'numeric' }
const TIME_PARTS: Intl.DateTimeFormatOptions = { ...DAY_PARTS, hour: '2-digit', minute: '2-digit', hourCycle: 'h23', timeZoneName: 'short' }

// Looked up by zone alone: the lists format a date or two on every row.
const dayFormats = new Map<string, Intl.DateTimeFormat>()
const timeFormats = new Map<string, Intl.DateTimeFormat>()

function validZone(timeZone: string | null | undefined): string {
  if (!timeZone) return FALLBACK_TIME_ZONE
  if (dayFormats.has(timeZone)) return timeZone
  try {
    dateTimeFormat('en-GB', { ...DAY_PARTS, timeZone })
    return timeZone
  } catch {
    return FALLBACK_TIME_ZONE
  }
}

function parts(at: Date, timeZone: string, withTime: boolean) {
  const formats = withTime ? timeFormats : dayFormats
  let format = formats.get(timeZone)
  if (!format) {
    format = dateTimeFormat('en-GB', { ...(withTime ? TIME_PARTS : DAY_PARTS), timeZone })
    formats.set(timeZone, format)
  }
  const found: Record<string, string> = {}
  for (const part of format.formatToParts(at)) found[part.type] = part.value
  return found
}

function toDate(value: string | Date): Date | null {
  const at = value instanceof Date ? value : new Date(value)
  return Number.isNaN(at.getTime()) ? null : at
}

/** "2 Dec 2026" for a stored calendar day ("2026-12-02"); the same day in every zone. */
export function formatCalendarDay(day: string | null | undefined, empty = '—'): string {
  if (!day) return empty
  if (!CALENDAR_DAY.test(day)) return formatEventDay(day, FALLBACK_TIME_ZONE, empty)
  const p = parts(new Date(`${day}T12:00:00Z`), 'UTC', false)
  return `${p.day} ${p.month} ${p.year}`
}

/** "2 Dec 2026": the day an event happened, in the given site's zone. */
export function formatEventDay(value: string | Date | null | undefined, timeZone: string | null | undefined, empty = '—'): string {
  if (!value) return empty
  if (typeof value === 'string' && CALENDAR_DAY.test(value)) return formatCalendarDay(value, empty)
  const at = toDate(value)
  if (!at) return empty
  const p = parts(at, validZone(timeZone), false)
  return `${p.day} ${p.month} ${p.year}`
}

/** "2 Dec 2026, 06:06 GMT": when an event happened, in the given site's zone, the zone named. */
export function formatEventTime(value: string | Date | null | undefined, timeZone: string | null | undefined, empty = '—'): string {
  if (!value) return empty
  const at = toDate(value)
  if (!at) return empty
  const p = parts(at, validZone(timeZone), true)
  return `${p.day} ${p.month} ${p.year}, ${p.hour}:${p.minute} ${p.timeZoneName}`
}

const isoDayFormats = new Map<string, Intl.DateTimeFormat>()

/** The calendar day (YYYY-MM-DD) of an instant in an IANA time zone (throws for a zone the platform does not know). */
export function localDay(at: Date | string, timeZone: string): string {
  let format = isoDayFormats.get(timeZone)
  if (!format) {
    format = dateTimeFormat('en-CA', { timeZone, year: 'numeric', month: '2-digit', day: '2-digit' })
    isoDayFormats.set(timeZone, format)
  }
  return format.format(new Date(at))
}

/**
 * The latest calendar day (YYYY-MM-DD) at `now` among UTC and the given zones: the day a program
 * with sites in those zones has reached somewhere. A zone the platform does not know is skipped.
 */
export function latestDay(now: Date, timeZones: readonly string[]): string {
  let latest = now.toISOString().slice(0, 10)
  for (const timeZone of timeZones) {
    let day: string
    try {
      day = localDay(now, timeZone)
    } catch {
      continue
    }
    if (day > latest) latest = day
  }
  return latest
}
