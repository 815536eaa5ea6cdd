import type { H3Event } from 'h3'

// Opening the sealed session cookie takes several Web Crypto steps (key derivation, MAC check,
// decryption) on every request, and a server-rendered page makes several requests with the same
// cookie. A sealed value is authenticated, so the same string always opens to the same session:
// what it opened to is kept for a minute (never past the session's own end). Nothing about who the
// caller is comes from here alone: `requireRole` still reads the user and their session version
// from the database on every request, so signing out everywhere or deactivating applies at once.

interface OpenedSession { id: string, createdAt: number, data: Record<string, unknown> }

const KEEP_MS = 60_000
const MAX_KEPT = 2000
// Kept as the JSON text the cookie sealed (a session is plain JSON): each request parses its own copy.
const kept = new Map<string, { json: string, until: number }>()

function sessionConfig() {
  const { name, maxAge } = useRuntimeConfig().session as { name: string, maxAge: number }
  return { name, maxAgeMs: maxAge * 1000 }
}

/** The sealed session this request carries in its cookie (none when it sends the session header instead). */
function sealedOf(event: H3Event, name: string) {
  if (getRequestHeader(event, `x-${name.toLowerCase()}-session`) !== undefined) return undefined
  return getCookie(event, name)
}

/**
 * Puts the session this request's cookie opened to within the last minute where h3 looks first,
 * so whatever reads the session next (ours or nuxt-auth-utils' own session route, which every
 * server-rendered page asks) does not open the cookie again. Run for every request (see
 * server/plugins/session-cache.ts); a cookie not opened lately is left to h3.
 */
export function primeSession(event: H3Event) {
  const { name } = sessionConfig()
  const sealed = sealedOf(event, name)
  const hit = sealed ? kept.get(sealed) : undefined
  if (!hit || hit.until <= Date.now()) return false
  const contexts = (event.context.sessions ??= Object.create(null)) as Record<string, OpenedSession>
  // A copy: a session update in this request must not change what other requests read.
  contexts[name] ??= JSON.parse(hit.json) as OpenedSession
  event.context.sessionPrimed = true
  return true
}

/**
 * Keeps what this request's cookie opened to, when it was opened here rather than primed from what
 * was kept. Never once the request has written its session cookie (a sign-in, a sign-out, an
 * update): the session in hand is then no longer what the cookie it came with opens to.
 */
export function keepSession(event: H3Event) {
  const { name, maxAgeMs } = sessionConfig()
  if (event.context.sessionPrimed || setsCookie(event, name)) return
  const sealed = sealedOf(event, name)
  const opened = (event.context.sessions as Record<string, OpenedSession> | undefined)?.[name]
  if (!sealed || !opened?.id || !opened.createdAt || !opened.data?.user) return
  if (kept.size >= MAX_KEPT) kept.delete(kept.keys().next().value!)
  kept.set(sealed, { json: JSON.stringify({ id: opened.id, createdAt: opened.createdAt, data: opened.data }), until: Math.min(Date.now() + KEEP_MS, opened.createdAt + maxAgeMs) })
}

function setsCookie(event: H3Event, name: string) {
  const set = getResponseHeader(event, 'set-cookie')
  const cookies = Array.isArray(set) ? set : set === undefined ? [] : [String(set)]
  return cookies.some(cookie => cookie.startsWith(`${name}=`))
}

/** The signed-in user's session, as `getUserSession` gives it, opening each sealed cookie once a minute at most. */
export async function readUserSession(event: H3Event) {
  primeSession(event)
  const session = await getUserSession(event)
  keepSession(event)
  return session
}
