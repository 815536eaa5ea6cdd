import { sql } from 'drizzle-orm'

export default defineEventHandler(async (event) => {
  const started = Date.now()
  try {
    await useDb().execute(sql`select 1`)
    return { status: 'ok', database: 'up', latencyMs: Date.now() - started }
  } catch {
    setResponseStatus(event, 503)
    return { status: 'degraded', database: 'down', message: 'The database does not answer. Results cannot be saved until it is back.' }
  }
})
