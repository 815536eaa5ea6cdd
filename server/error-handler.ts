import type { NitroErrorHandler } from 'nitropack'
import { databaseRefusal } from './utils/database-refusals'
import { isConnectionFailure, requestDbOutcome } from './utils/db-outcome'
import { logServerError } from './utils/log'

/**
 * What a person reads when PostgreSQL cannot be reached. "Nothing was changed" is said only when
 * no write of this request can have been stored; a COMMIT (or lone write) that got no answer may
 * have been applied, so that case says to reload before retrying.
 */
export function outageMessage(outcome: { committed: boolean, uncertain: boolean } | undefined) {
  if (outcome?.uncertain) return 'The database stopped answering while saving. The change may have been saved — reload before retrying.'
  if (outcome?.committed) return 'The database stopped answering part-way. Part of this change may have been saved — reload before retrying.'
  return 'The database is unavailable; nothing was changed. Try again in a moment.'
}

function sendJson(event: Parameters<NitroErrorHandler>[1], statusCode: number, statusMessage: string, message: string) {
  setResponseStatus(event, statusCode, statusMessage)
  setResponseHeader(event, 'Content-Type', 'application/json')
  setResponseHeader(event, 'Cache-Control', 'no-store')
  return send(event, JSON.stringify({ statusCode, statusMessage, message }))
}

/**
 * Runs before Nuxt's own handler. A lost database becomes a plain 503 for API callers (the pool
 * reconnects by itself once PostgreSQL is back); any other server failure is logged by ids and
 * codes only — never the names or clearance data a raw error could quote — and answered plainly.
 */
const handler: NitroErrorHandler = (error, event) => {
  const isApi = event.path.startsWith('/api/')
  const callerId = (event.context.caller as { id?: string } | undefined)?.id
  if (isConnectionFailure(error)) {
    const outcome = requestDbOutcome(event)
    logServerError('database unavailable', error, { method: event.method, route: routeOf(event.path), caller: callerId, uncertain: outcome?.uncertain ? 1 : undefined })
    if (!isApi) return
    setResponseHeader(event, 'Retry-After', 5)
    return sendJson(event, 503, 'Service Unavailable', outageMessage(outcome))
  }
  if (hasCode(error, 'SW001')) {
    // The database's own guard on finished fit-test revisions (see DEVELOPERS.md, Database roles).
    if (!isApi) return
    return sendJson(event, 409, 'Conflict', 'This fit-test revision is finished and cannot be changed. Reload it; to change it, start a correction.')
  }
  // A duplicate, an out-of-range value or a lost race is the request's problem, not the server's.
  const refusal = databaseRefusal(error)
  if (refusal) {
    if (!isApi) return
    const refusalStatus = refusal.statusCode ?? 400
    setResponseStatus(event, refusalStatus)
    setResponseHeader(event, 'Content-Type', 'application/json')
    return send(event, JSON.stringify({ statusCode: refusalStatus, message: refusal.message, data: refusal.data }))
  }
  const statusCode = error.statusCode ?? 500
  if (statusCode < 500) return
  logServerError('request failed', error.cause ?? error, { status: statusCode, method: event.method, route: routeOf(event.path), caller: callerId })
  if (!isApi) return
  if (statusCode === 503 && error.message) return sendJson(event, 503, 'Service Unavailable', error.message)
  return sendJson(event, statusCode, 'Server Error', 'The server could not finish this request. Reload to see what was saved, then try again; if it keeps happening, tell your administrator.')
}

function hasCode(error: unknown, code: string) {
  let current = error as { code?: unknown, cause?: unknown } | undefined
  for (let depth = 0; current && depth < 6; depth++) {
    if (current.code === code) return true
    current = current.cause as typeof current
  }
  return false
}

/** The path with ids and tokens blanked, so a log line names the route, not the record. */
function routeOf(path: string) {
  return path.split('?')[0]!
    .replace(/[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}/gi, ':id')
    .replace(/\/[A-Za-z0-9_-]{20,}/g, '/:token')
}

export default handler
