/** Bytes a request body may have: 2 MB, more only where a count series travels inside the JSON. */
export const BODY_LIMIT_BYTES = 2 * 1024 * 1024
export const SERIES_BODY_LIMIT_BYTES = 8 * 1024 * 1024

/** Routes whose body may carry a pasted or uploaded count series (up to 2 MB of text, escaped in JSON). */
const SERIES_ROUTES = [/^\/api\/fit-tests\/?$/, /^\/api\/fit-tests\/[^/]+\/?$/, /^\/api\/fit-tests\/[^/]+\/revisions\/?$/]

export function bodyLimitFor(path: string) {
  const bare = path.split('?')[0]!
  return SERIES_ROUTES.some(re => re.test(bare)) ? SERIES_BODY_LIMIT_BYTES : BODY_LIMIT_BYTES
}

export function megabytes(bytes: number) {
  return `${Math.round(bytes / 1024 / 1024)} MB`
}

const STATE_CHANGING = new Set(['POST', 'PUT', 'PATCH', 'DELETE'])

export function changesState(method: string) {
  return STATE_CHANGING.has(method.toUpperCase())
}

/**
 * Whether a state-changing request may come from where it says it comes from. Browsers send
 * `Sec-Fetch-Site` and `Origin` with every such request; a page on another site cannot forge them.
 * Clients that send neither (scripts, the API tests) are not browsers carrying someone's cookie
 * on another site's behalf, so they pass.
 */
export function isCrossSite(headers: { secFetchSite?: string, origin?: string }, ownOrigins: string[]) {
  const site = headers.secFetchSite?.toLowerCase()
  if (site && site !== 'same-origin' && site !== 'none') return true
  const origin = headers.origin
  if (origin === undefined || origin === '') return false
  if (origin === 'null') return true
  return !ownOrigins.includes(origin.toLowerCase())
}
