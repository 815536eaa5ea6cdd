import { drizzle } from 'drizzle-orm/node-postgres'
import pg from 'pg'
import * as schema from '../../server/database/schema'

export function connect(url: string) {
  const pool = new pg.Pool({ connectionString: url, max: 4 })
  const db = drizzle(pool, { schema, casing: 'snake_case' })
  return { db, pool, schema }
}

export type SeedDb = ReturnType<typeof connect>['db']
export { schema }
