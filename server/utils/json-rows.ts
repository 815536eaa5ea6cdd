import { Column, getTableColumns, sql } from 'drizzle-orm'
import type { SQL } from 'drizzle-orm'
import { toSnakeCase } from 'drizzle-orm/casing'
import type { PgTable } from 'drizzle-orm/pg-core'

// Several tables in one round trip: a subquery aggregates each table's rows as JSON, and the
// decoders below read them back with each column's own decoder, so a row reads exactly as a
// `select` would (timestamps as Date, jsonb parsed, `date` columns as strings).

/** `json_agg` of the whole rows of `table` that match `where`, in `orderBy` order (`rowsFromJson` reads them). */
export function rowsOf(table: PgTable, where: SQL | undefined, orderBy?: SQL) {
  const order = orderBy ? sql` order by ${orderBy}` : sql``
  return sql`(select coalesce(json_agg(to_jsonb(${table})${order}), '[]'::json) from ${table} where ${where ?? sql`true`})`
}

/** The rows of `table` as `to_jsonb(row)` made them (snake_case keys), decoded as `select()` would. */
export function rowsFromJson<T extends PgTable>(table: T, rows: unknown): T['$inferSelect'][] {
  const columns = Object.entries(getTableColumns(table)).map(([key, column]) => [key, column.keyAsName ? toSnakeCase(key) : column.name, column] as const)
  return (rows as Record<string, unknown>[]).map((json) => {
    const out: Record<string, unknown> = {}
    for (const [key, name, column] of columns) {
      const value = json[name]
      out[key] = value === null || value === undefined ? null : column.mapFromDriverValue(value)
    }
    return out as T['$inferSelect']
  })
}

type Fields = Record<string, Column>
/** What `select(fields)` gives for one row. */
export type Decoded<F extends Fields> = { [K in keyof F]: F[K]['_']['notNull'] extends true ? F[K]['_']['data'] : F[K]['_']['data'] | null }

/** `json_build_object` of named columns (at most 50: PostgreSQL takes 100 arguments). */
export function objectOf(fields: Fields) {
  return sql`json_build_object(${sql.join(Object.entries(fields).map(([key, column]) => sql`${sql.raw(`'${key}'`)}, ${column}`), sql`, `)})`
}

/** Objects made by `objectOf(fields)`, decoded as a `select(fields)` would. */
export function objectsFromJson<F extends Fields>(fields: F, rows: unknown): Decoded<F>[] {
  const entries = Object.entries(fields)
  return (rows as Record<string, unknown>[]).map((json) => {
    const out: Record<string, unknown> = {}
    for (const [key, column] of entries) {
      const value = json[key]
      out[key] = value === null || value === undefined ? null : column instanceof Column ? column.mapFromDriverValue(value) : value
    }
    return out as Decoded<F>
  })
}
