import type pg from 'pg'

/**
 * What one request has done to the database so far, so that an outage can be answered honestly:
 * "nothing was changed" only when no write of this request can have reached the disk.
 */
export interface DbOutcome {
  /** Inside BEGIN … COMMIT/ROLLBACK on some connection of this request. */
  openTransactions: number
  /** A write or COMMIT succeeded: something of this request is stored. */
  committed: boolean
  /** A write outside a transaction, or a COMMIT, was sent and no answer came back. */
  uncertain: boolean
}

const WRITE = /^\s*(insert|update|delete|merge|with\b[\s\S]*\b(insert|update|delete)\b)/i
const BEGIN = /^\s*(begin|start transaction)\b/i
const COMMIT = /^\s*(commit|end)\b/i
const ROLLBACK = /^\s*rollback\b/i

function textOf(query: unknown): string {
  if (typeof query === 'string') return query
  if (query && typeof query === 'object' && 'text' in query && typeof query.text === 'string') return query.text
  return ''
}

function currentOutcome(): DbOutcome | undefined {
  try {
    const event = useEvent()
    event.context.dbOutcome ??= { openTransactions: 0, committed: false, uncertain: false } satisfies DbOutcome
    return event.context.dbOutcome as DbOutcome
  } catch {
    // Outside a request (start-up, background work): nothing to report to anyone.
    return undefined
  }
}

/** The outcome of the request being answered, if any database work was done. */
export function requestDbOutcome(event: { context: Record<string, unknown> }): DbOutcome | undefined {
  return event.context.dbOutcome as DbOutcome | undefined
}

/**
 * Wraps a client's promise-returning `query` so every statement updates the outcome of the
 * request that sent it. Callback-style calls pass through untouched.
 */
export function trackOutcomes(client: pg.PoolClient | pg.Pool) {
  const original = client.query.bind(client) as (...args: unknown[]) => unknown
  ;(client as { query: unknown }).query = (...args: unknown[]) => {
    const result = original(...args)
    if (!(result instanceof Promise)) return result
    const outcome = currentOutcome()
    if (!outcome) return result
    const text = textOf(args[0])
    // Attempt counters are bookkeeping, not the change a person asked for.
    const isWrite = WRITE.test(text) && !/\brate_limits\b/.test(text)
    const isCommit = COMMIT.test(text)
    if (BEGIN.test(text)) outcome.openTransactions++
    return result.then((value) => {
      if (isCommit) {
        outcome.openTransactions = Math.max(0, outcome.openTransactions - 1)
        outcome.committed = true
      } else if (ROLLBACK.test(text)) {
        outcome.openTransactions = Math.max(0, outcome.openTransactions - 1)
      } else if (isWrite && outcome.openTransactions === 0) {
        outcome.committed = true
      }
      return value
    }, (error: unknown) => {
      // A COMMIT, or a lone write, that got no answer may or may not have been applied.
      if ((isCommit || (isWrite && outcome.openTransactions === 0)) && isConnectionFailure(error)) {
        outcome.uncertain = true
      }
      if (isCommit || ROLLBACK.test(text)) outcome.openTransactions = Math.max(0, outcome.openTransactions - 1)
      throw error
    })
  }
}

const CONNECTION_CODES = new Set(['ECONNREFUSED', 'ECONNRESET', 'ETIMEDOUT', 'EPIPE', 'ENOTFOUND', 'EHOSTUNREACH', 'ENETUNREACH', '57P01', '57P02', '57P03', '08000', '08001', '08003', '08004', '08006', '08007'])
const CONNECTION_MESSAGES = [
  /Connection terminated/i,
  /timeout exceeded when trying to connect/i,
  /connect ECONNREFUSED/i,
  /the database system is (starting up|shutting down|in recovery mode)/i,
  /Client has encountered a connection error and is not queryable/i,
  /Client was closed and is not queryable/i,
  /Cannot use a pool after calling end/i,
  /terminating connection due to administrator command/i,
  /server closed the connection unexpectedly/i
]

/** True when the error, or anything it wraps, says PostgreSQL could not be reached or went away. */
export function isConnectionFailure(error: unknown): boolean {
  let current: unknown = error
  for (let depth = 0; current && depth < 8; depth++) {
    const e = current as { code?: unknown, message?: unknown, cause?: unknown, errors?: unknown[] }
    if (typeof e.code === 'string' && CONNECTION_CODES.has(e.code)) return true
    if (typeof e.message === 'string' && CONNECTION_MESSAGES.some(re => re.test(e.message as string))) return true
    if (Array.isArray(e.errors) && e.errors.some(isConnectionFailure)) return true
    current = e.cause
  }
  return false
}
