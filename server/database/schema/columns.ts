import { sql } from 'drizzle-orm'
import type { AnyPgColumn } from 'drizzle-orm/pg-core'
import { check, timestamp, uuid } from 'drizzle-orm/pg-core'

export const timestamps = {
  createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  updatedAt: timestamp({ withTimezone: true }).notNull().defaultNow().$onUpdate(() => new Date())
}

export const id = () => uuid().primaryKey().defaultRandom()

/**
 * A CHECK constraint that keeps a text column to the values of one `as const` array
 * (shared/utils/enums.ts and the area schemas), so the database refuses what the types refuse.
 */
export function oneOf(name: string, column: AnyPgColumn, values: readonly string[]) {
  const list = values.map(v => `'${v.replaceAll('\'', '\'\'')}'`).join(', ')
  return check(name, sql`${column} in (${sql.raw(list)})`)
}
