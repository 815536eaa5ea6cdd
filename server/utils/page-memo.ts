import type { H3Event } from 'h3'
import { LRUCache } from 'lru-cache'

/*
 * A signed-in page drawn for the same request as one drawn moments ago, with nothing written since,
 * is sent again as it was drawn, with a fresh CSP nonce, instead of being drawn again.
 *
 * "Nothing written since" is PostgreSQL's word, not ours: the key holds the database's transaction
 * snapshot (`pg_current_snapshot()`, read in the same statement that checks the caller). Its text
 * changes as soon as any transaction that writes anything, from any process or tool, starts or
 * ends, and a snapshot text never comes back once it has changed. So a page is only ever sent again
 * while the database holds exactly what it held when the page began to be drawn: a page cannot show
 * a result older than the one a fresh draw would show. The rest of the key is what else a page is
 * drawn from: the address (host, path and query), the request's cookies (so the caller and their
 * session), and the clock's minute (due dates, "today" in every time zone and the clock on the
 * overview turn over on a minute).
 *
 * A page must be drawn from PostgreSQL alone: what comes from elsewhere (the outbox, held by the
 * mail catcher) is read in the browser.
 *
 * Never kept: a signed-out page, anything but a 200 HTML page, a page that sets a cookie, and a page
 * any of whose reads failed while it was drawn (app/plugins/page-memo.server.ts and the `$fetch`
 * wrapper below), so a passing outage is never sent again.
 *
 * Per process and in memory: 64 MB of pages at most, none kept over two minutes.
 * SEALWRIGHT_PAGE_MEMO=off draws every page (the speed bench measures both).
 */

interface KeptPage {
  html: string
  nonce: string | undefined
  headers: [string, string][]
}

const MAX_BYTES = 64 * 1024 * 1024
const MAX_PAGE_CHARS = 1024 * 1024
const KEEP_MS = 120_000
// Set again for each send: the body's length and coding come from the compression plugin, the
// cookie is never kept.
const NOT_KEPT_HEADERS = new Set(['content-length', 'content-encoding', 'transfer-encoding', 'vary', 'set-cookie', 'x-sealwright-page'])

const kept = new LRUCache<string, KeptPage>({
  maxSize: MAX_BYTES,
  sizeCalculation: page => page.html.length * 2 + 2048,
  ttl: KEEP_MS
})

const enabled = () => process.env.SEALWRIGHT_PAGE_MEMO !== 'off'

interface MemoContext {
  key?: string
  refused?: boolean
  sent?: boolean
  html?: unknown
}

function memoOf(event: H3Event): MemoContext {
  return (event.context.pageMemo ??= {}) as MemoContext
}

/**
 * Called by the page middleware once the caller is known: the HTML of the page kept for this exact
 * request while the database stood at `snapshot`, its headers set with this request's nonce; or
 * `false`, and the page is drawn (and kept as it leaves, when it may be).
 */
export function sendKeptPage(event: H3Event, snapshot: string) {
  if (!enabled() || event.method !== 'GET') return false
  const memo = memoOf(event)
  memo.key = [Math.floor(Date.now() / 60_000), snapshot, getRequestHeader(event, 'cookie') ?? '', getRequestHeader(event, 'host') ?? '', event.path].join('\n')
  watchReads(event)
  const page = kept.get(memo.key)
  if (!page) return false
  const nonce = (event.context.security as { nonce?: string } | undefined)?.nonce
  // A page is only kept with a nonce when it was drawn with one, and every request gets its own.
  if (page.nonce && !nonce) return false
  const renonce = (text: string) => page.nonce && nonce ? text.replaceAll(page.nonce, nonce) : text
  for (const [name, value] of page.headers) setResponseHeader(event, name, renonce(value))
  setResponseHeader(event, 'x-sealwright-page', 'kept')
  memo.sent = true
  return renonce(page.html)
}

/** Marks the page being drawn as not to be kept (one of its reads failed, or the render erred). */
export function refuseToKeepPage(event: H3Event) {
  memoOf(event).refused = true
}

/** Notes the HTML the renderer made for this request, before anything compresses it. */
export function noteDrawnPage(event: H3Event, body: unknown) {
  const memo = event.context.pageMemo as MemoContext | undefined
  if (memo?.key) memo.html = body
}

/** Keeps the page this request drew, when it may be kept (see the top of this file). */
export function keepDrawnPage(event: H3Event) {
  const memo = event.context.pageMemo as MemoContext | undefined
  if (!memo?.key || memo.sent || memo.refused) return
  const body = memo.html
  memo.html = undefined
  if (typeof body !== 'string' || body.length > MAX_PAGE_CHARS) return
  if (getResponseStatus(event) !== 200 || !String(getResponseHeader(event, 'content-type') ?? '').startsWith('text/html')) return
  if (getResponseHeader(event, 'set-cookie') !== undefined) return
  const headers = Object.entries(getResponseHeaders(event))
    .filter(([name, value]) => value !== undefined && !NOT_KEPT_HEADERS.has(name.toLowerCase()))
    .map(([name, value]) => [name, Array.isArray(value) ? value.join(', ') : String(value)] as [string, string])
  kept.set(memo.key, { html: body, nonce: (event.context.security as { nonce?: string } | undefined)?.nonce, headers })
  setResponseHeader(event, 'x-sealwright-page', 'drawn')
}

// Every read a page makes while it is drawn goes through `event.$fetch` (useFetch, useRequestFetch);
// one that fails means the page shows a failure (or a fallback) that must not be sent again.
function watchReads(event: H3Event) {
  const read = event.$fetch as ((...args: unknown[]) => Promise<unknown>) | undefined
  if (!read) return
  event.$fetch = ((...args: unknown[]) => read(...args).catch((error: unknown) => {
    refuseToKeepPage(event)
    throw error
  })) as typeof event.$fetch
}
