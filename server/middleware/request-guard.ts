/**
 * Before any API route reads a body: refuses cross-site state changes (a form on another site
 * posting with the user's cookie) and bodies over the limit, with a sentence that says so.
 */
export default defineEventHandler((event) => {
  if (!event.path.startsWith('/api/') || !changesState(event.method)) return

  const config = useRuntimeConfig(event)
  const trust = Boolean(config.trustProxy)
  const own = getRequestURL(event, { xForwardedHost: trust, xForwardedProto: trust }).origin.toLowerCase()
  const configured = safeOrigin(config.public.baseUrl)
  const origins = configured ? [own, configured] : [own]
  if (isCrossSite({ secFetchSite: getRequestHeader(event, 'sec-fetch-site'), origin: getRequestHeader(event, 'origin') }, origins)) {
    throw httpError(403, 'This request came from another website and was refused. Open Sealwright directly and try again.')
  }

  const limit = bodyLimitFor(event.path)
  const declared = Number(getRequestHeader(event, 'content-length') ?? 'NaN')
  if (Number.isFinite(declared) && declared > limit) {
    throw httpError(413, `The request is larger than ${megabytes(limit)}; nothing was saved. Send less at once (split a long series or list).`)
  }
  if (!Number.isFinite(declared) && getRequestHeader(event, 'transfer-encoding')) {
    throw httpError(411, 'The request must state its length. Send it again from the Sealwright page.')
  }
})

function safeOrigin(url: string | undefined) {
  try {
    return url ? new URL(url).origin.toLowerCase() : undefined
  } catch {
    return undefined
  }
}
