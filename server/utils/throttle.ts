import { eq, inArray, sql } from 'drizzle-orm'
import type { H3Event } from 'h3'

/** Failures allowed per key inside the window before the key is locked for the rest of the window. */
export const THROTTLE_RULES = {
  email: { maxFailures: 5, windowMinutes: 15 },
  address: { maxFailures: 30, windowMinutes: 15 }
} as const

export interface ThrottleKeys {
  email: string
  address: string
}

function keysOf(keys: ThrottleKeys) {
  return { email: `email:${keys.email}`, address: `address:${keys.address}` }
}

/** Throws 429 with Retry-After when either the e-mail or the client address is locked. */
export async function assertNotThrottled(event: H3Event, keys: ThrottleKeys) {
  const k = keysOf(keys)
  const rows = await useDb().select().from(schema.signInFailures)
    .where(inArray(schema.signInFailures.key, [k.email, k.address]))
  const now = Date.now()
  const lockedUntil = Math.max(0, ...rows.map(r => r.lockedUntil?.getTime() ?? 0))
  if (lockedUntil > now) {
    const seconds = Math.ceil((lockedUntil - now) / 1000)
    const minutes = Math.ceil(seconds / 60)
    setResponseHeader(event, 'Retry-After', seconds)
    throw httpError(429, `Too many failed sign-ins. Try again in ${minutes} minute${minutes === 1 ? '' : 's'}.`, { retryAfterSeconds: seconds })
  }
}

export async function recordSignInFailure(keys: ThrottleKeys) {
  const k = keysOf(keys)
  const db = useDb()
  for (const [kind, key] of [['email', k.email], ['address', k.address]] as const) {
    const rule = THROTTLE_RULES[kind]
    // One statement per key: a window older than the rule starts afresh; reaching the limit locks the key.
    await db.execute(sql`
      insert into sign_in_failures (key, failures, window_started_at)
      values (${key}, 1, now())
      on conflict (key) do update set
        failures = case when sign_in_failures.window_started_at < now() - make_interval(mins => ${rule.windowMinutes})
          then 1 else sign_in_failures.failures + 1 end,
        window_started_at = case when sign_in_failures.window_started_at < now() - make_interval(mins => ${rule.windowMinutes})
          then now() else sign_in_failures.window_started_at end
    `)
    await db.execute(sql`
      update sign_in_failures set locked_until = window_started_at + make_interval(mins => ${rule.windowMinutes})
      where key = ${key} and failures >= ${rule.maxFailures}
    `)
  }
}

export async function clearSignInFailures(email: string) {
  await useDb().delete(schema.signInFailures).where(eq(schema.signInFailures.key, `email:${email}`))
}
