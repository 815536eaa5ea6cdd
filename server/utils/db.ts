import { appendFileSync } from 'node:fs'
import { drizzle } from 'drizzle-orm/node-postgres'
import type { Logger } from 'drizzle-orm'
import pg from 'pg'
import * as schema from '../database/schema'

export { schema }
export type Database = ReturnType<typeof createDatabase>
/** The handle a `useDb().transaction(async (tx) => …)` callback receives; helpers that write beside an audit row take it. */
export type Tx = Parameters<Parameters<Database['transaction']>[0]>[0]

function createDatabase(url: string) {
  const pool = new pg.Pool({
    connectionString: url,
    max: 10,
    connectionTimeoutMillis: 3000,
    idleTimeoutMillis: 30_000
  })
  // A client losing its connection (the database restarted) must not crash the server, whether it
  // sits idle in the pool or is checked out between two statements: the pool drops it and the
  // next query opens a fresh one.
  pool.on('error', (error) => {
    logServerError('db idle connection lost', error)
  })
  pool.on('connect', (client) => {
    client.on('error', error => logServerError('db connection lost', error))
    trackOutcomes(client)
  })
  trackOutcomes(pool)
  return Object.assign(drizzle(pool, { schema, casing: 'snake_case', logger: benchLogger() }), { pool })
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

/**
 * Only for `npm run bench:api`: with SEALWRIGHT_BENCH_SQL_LOG set, the statements (with their
 * parameters) of each request carrying `x-sealwright-bench-capture: 1` are appended to that file,
 * so the bench can replay a route's SQL on bare pg as its floor. Other requests write nothing.
 */
function benchLogger(): Logger | undefined {
  const file = process.env.SEALWRIGHT_BENCH_SQL_LOG
  if (!file) return undefined
  return {
    logQuery: (query, params) => {
      try {
        if (getRequestHeader(useEvent(), 'x-sealwright-bench-capture') !== '1') return
      } catch {
        return
      }
      appendFileSync(file, `${JSON.stringify({ query, params })}\n`)
    }
  }
}
