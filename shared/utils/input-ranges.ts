import { z } from 'zod'

/**
 * Ranges a typed value must fall in before it reaches the database. They refuse what cannot be
 * real (a year 0, a clearance dated next decade, a draft version beyond any count of saves) with a
 * message beside the field; they never round or clamp what the person typed.
 */

/** No respiratory-protection record we keep predates this (common practice, no published source). */
export const EARLIEST_RECORD_DATE = '1900-01-01'

/** Largest integer a PostgreSQL `integer` column holds. */
export const MAX_DATABASE_INTEGER = 2_147_483_647

/** Today in UTC plus a day, so a person east of UTC is never refused their own today. */
function latestPlausibleToday(now = new Date()): string {
  return new Date(now.getTime() + 86_400_000).toISOString().slice(0, 10)
}

export type DateLimit = 'today' | 'none'

/** A calendar date (YYYY-MM-DD) from 1900 to 2999; with `latest: 'today'`, nothing after today. */
export function calendarDate(message: string, latest: DateLimit = 'none') {
  return z.iso.date({ error: message })
    .refine(v => v >= EARLIEST_RECORD_DATE, { error: 'Use a date from 1900 on.' })
    .refine(v => latest === 'none' || v <= latestPlausibleToday(), { error: 'This date is in the future; use the date it happened.' })
    .refine(v => v <= '2999-12-31', { error: 'Use a date before the year 3000.' })
}

/** An instant with its offset, from 1900 on and no later than tomorrow: something that happened. */
export function pastInstant(message: string) {
  return z.iso.datetime({ offset: true, error: message })
    .refine((v) => {
      const t = Date.parse(v)
      return Number.isFinite(t) && t >= Date.parse(`${EARLIEST_RECORD_DATE}T00:00:00Z`)
    }, { error: 'Use a time from 1900 on.' })
    .refine(v => Date.parse(v) <= Date.now() + 86_400_000, { error: 'This time is in the future; use the time the test was done.' })
}

/** A whole number a PostgreSQL `integer` column can hold, for versions, steps and counts of days. */
export function databaseInteger(message: string) {
  return z.number({ error: message }).int({ error: 'Use a whole number.' }).max(MAX_DATABASE_INTEGER, { error: 'This number is far too large.' })
}

/** Page numbers of lists: far beyond any real list, small enough for any offset. */
export const pageNumber = z.coerce.number().int().min(1).max(100_000, { error: 'There is no such page.' }).default(1)

type WithoutDefault<F> = F extends z.ZodDefault<infer Inner> ? Inner : F
type ChangesShape<S extends z.core.$ZodShape> = { [K in keyof S]: z.ZodOptional<WithoutDefault<S[K]>> }

/**
 * The schema of a change (PATCH) made from the schema of a new record: every field optional and
 * no defaults. zod's own `.partial()` keeps defaults, so a change that names one field would
 * quietly reset every defaulted field the person did not send (a site, a clearance status).
 */
export function changesSchema<S extends z.core.$ZodShape>(schema: z.ZodObject<S>): z.ZodObject<ChangesShape<S>> {
  const shape: Record<string, z.ZodType> = {}
  for (const [key, field] of Object.entries(schema.shape)) {
    const inner = field instanceof z.ZodDefault ? field.unwrap() : field
    shape[key] = (inner as z.ZodType).optional()
  }
  return z.object(shape) as unknown as z.ZodObject<ChangesShape<S>>
}
