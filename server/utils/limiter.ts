import { createHash } from 'node:crypto'
import type { H3Event } from 'h3'
import { RateLimiterPostgres, RateLimiterRes } from 'rate-limiter-flexible'

/**
 * Attempt limits, kept in PostgreSQL (`rate_limits`) so several app instances share them.
 * Designed so nobody can lock someone else out: wrong passwords count per (e-mail, address)
 * pair, so a stranger elsewhere cannot lock the account; an address gets a generous limit of its
 * own (a whole site may share one); reset requests never count against sign-in.
 */
export const LIMITS = {
  /** Wrong passwords for one e-mail from one address. */
  signInPair: { points: 5, durationSeconds: 15 * 60 },
  /** Wrong passwords from one address, whatever the e-mail. */
  signInAddress: { points: 50, durationSeconds: 15 * 60 },
  /** Reset requests from one address. */
  resetAddress: { points: 20, durationSeconds: 15 * 60 },
  /** Reset mails to one e-mail: more requests answer the same but send nothing. */
  resetMail: { points: 3, durationSeconds: 60 * 60 }
} as const

type LimitName = keyof typeof LIMITS

const limiters = new Map<LimitName, RateLimiterPostgres>()

function limiter(name: LimitName) {
  let found = limiters.get(name)
  if (!found) {
    const rule = LIMITS[name]
    found = new RateLimiterPostgres({
      storeClient: useDb().pool,
      tableName: 'rate_limits',
      // The table comes from the migrations; the app's database role may not create tables.
      tableCreated: true,
      keyPrefix: name,
      points: rule.points,
      duration: rule.durationSeconds
    })
    limiters.set(name, found)
  }
  return found
}

/** Keys are hashed: the table never holds an e-mail address or a client address in clear. */
function keyOf(...parts: string[]) {
  return createHash('sha256').update(parts.join('\u0000')).digest('hex').slice(0, 40)
}

export interface AttemptKeys {
  email: string
  address: string
}

function tooMany(event: H3Event, msBeforeNext: number, what: string): never {
  const seconds = Math.max(1, Math.ceil(msBeforeNext / 1000))
  const minutes = Math.ceil(seconds / 60)
  setResponseHeader(event, 'Retry-After', seconds)
  throw httpError(429, `Too many ${what} from this connection. Try again in ${minutes} minute${minutes === 1 ? '' : 's'}.`, { retryAfterSeconds: seconds })
}

/** Refuses with 429 and Retry-After when this pair or this address has used up its wrong passwords. */
export async function assertSignInAllowed(event: H3Event, keys: AttemptKeys) {
  const [pair, address] = await Promise.all([
    limiter('signInPair').get(keyOf(keys.email, keys.address)),
    limiter('signInAddress').get(keyOf(keys.address))
  ])
  const blocked = [
    pair && pair.consumedPoints >= LIMITS.signInPair.points ? pair : null,
    address && address.consumedPoints >= LIMITS.signInAddress.points ? address : null
  ].filter((r): r is RateLimiterRes => r !== null)
  if (blocked.length) {
    tooMany(event, Math.max(...blocked.map(r => r.msBeforeNext)), 'failed sign-ins')
  }
}

/** Counts one wrong password for the pair and for the address. */
export async function recordSignInFailure(keys: AttemptKeys) {
  await Promise.all([
    consumeQuietly('signInPair', keyOf(keys.email, keys.address)),
    consumeQuietly('signInAddress', keyOf(keys.address))
  ])
}

/** A right password forgets this pair's wrong ones (the address count stays). */
export async function clearSignInFailures(keys: AttemptKeys) {
  await limiter('signInPair').delete(keyOf(keys.email, keys.address))
}

/** Counts a reset request; 429 only for an address sending many. */
export async function assertResetAllowed(event: H3Event, address: string) {
  try {
    await limiter('resetAddress').consume(keyOf(address))
  } catch (error) {
    if (error instanceof RateLimiterRes) tooMany(event, error.msBeforeNext, 'reset requests')
    throw error
  }
}

/** True while this address may still be sent a reset mail this hour; never locks anything. */
export async function resetMailAllowed(email: string) {
  return consumeQuietly('resetMail', keyOf(email))
}

/** Consumes a point; false when the limit was already reached. Store failures still throw. */
async function consumeQuietly(name: LimitName, key: string) {
  try {
    await limiter(name).consume(key)
    return true
  } catch (error) {
    if (error instanceof RateLimiterRes) return false
    throw error
  }
}
