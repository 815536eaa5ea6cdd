import type { H3Event } from 'h3'

/** The client's address for throttling; X-Forwarded-For is believed only when runtimeConfig.trustProxy is on. */
export function clientAddress(event: H3Event): string {
  const trust = useRuntimeConfig(event).trustProxy
  return getRequestIP(event, { xForwardedFor: Boolean(trust) }) ?? 'unknown'
}
