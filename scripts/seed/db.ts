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

/** One demo organization as the seed steps see it, after its accounts and sites exist. */
export interface SeededOrganization {
  id: string
  slug: string
  siteIds: string[]
  userIds: Record<string, string>
}
