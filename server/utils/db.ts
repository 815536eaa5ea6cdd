import { drizzle } from 'drizzle-orm/node-postgres'
import pg from 'pg'
import * as schema from '../database/schema'

export { schema }
export type Database = ReturnType<typeof createDatabase>

function createDatabase(url: string) {
  const pool = new pg.Pool({
    connectionString: url,
    max: 10,
    connectionTimeoutMillis: 3000,
    idleTimeoutMillis: 30_000
  })
  // An idle client losing its connection (the database restarted) must not crash the server;
  // the pool drops it and the next query opens a fresh one.
  pool.on('error', (error) => {
    console.warn(`[db] idle connection lost: ${error.message}`)
  })
  return Object.assign(drizzle(pool, { schema, casing: 'snake_case' }), { pool })
}

let database: Database | undefined

export function useDb(): Database {
  if (!database) {
    const url = useRuntimeConfig().databaseUrl
    if (!url) {
      throw httpError(503, 'The database is not configured (NUXT_DATABASE_URL is empty).')
    }
    database = createDatabase(url)
  }
  return database
}
