import type { NitroErrorHandler } from 'nitropack'
import { databaseRefusal } from './utils/database-refusals'

const OUTAGE_CODES = new Set(['ECONNREFUSED', 'ECONNRESET', 'ETIMEDOUT', 'EPIPE', 'ENOTFOUND', '57P01', '57P02', '57P03', '08000', '08001', '08003', '08004', '08006'])
const OUTAGE_MESSAGES = [/Connection terminated/i, /timeout exceeded when trying to connect/i, /connect ECONNREFUSED/i, /the database system is (starting up|shutting down)/i]

/** True when the error, or anything it wraps, says PostgreSQL cannot be reached right now. */
function isDatabaseOutage(error: unknown): boolean {
  let current: unknown = error
  for (let depth = 0; current && depth < 8; depth++) {
    const e = current as { code?: string, message?: string, cause?: unknown, errors?: unknown[] }
    if (e.code && OUTAGE_CODES.has(e.code)) return true
    if (e.message && OUTAGE_MESSAGES.some(re => re.test(e.message!))) return true
    if (Array.isArray(e.errors) && e.errors.some(isDatabaseOutage)) return true
    current = e.cause
  }
  return false
}

/**
 * Runs before Nuxt's own handler. A lost database becomes a plain 503 for API callers; the pool
 * reconnects on the next request once PostgreSQL is back, so nothing needs restarting.
 */
const handler: NitroErrorHandler = (error, event) => {
  if (!event.path.startsWith('/api/')) return
  // A duplicate, an out-of-range value or a lost race is the request's problem, not the server's.
  const refusal = databaseRefusal(error)
  if (refusal) {
    const statusCode = refusal.statusCode ?? 400
    setResponseStatus(event, statusCode)
    setResponseHeader(event, 'Content-Type', 'application/json')
    return send(event, JSON.stringify({ statusCode, message: refusal.message, data: refusal.data }))
  }
  if (!isDatabaseOutage(error)) return
  setResponseStatus(event, 503, 'Database unavailable')
  setResponseHeader(event, 'Content-Type', 'application/json')
  setResponseHeader(event, 'Retry-After', 5)
  return send(event, JSON.stringify({
    statusCode: 503,
    statusMessage: 'Service Unavailable',
    message: 'The database is not answering. Nothing was saved; try again in a moment.'
  }))
}

export default handler
