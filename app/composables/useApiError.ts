import type { FetchError } from 'ofetch'

// HTTP reason phrases are not sentences a fit tester should have to read.
const REASON_PHRASE = /^(internal server error|server error|bad gateway|gateway timeout|service unavailable|not found|forbidden|unauthorized|bad request|fetch failed|failed to fetch)\.?$/i

/** The message and per-field messages a route sent, in the shape forms show. */
export function apiErrorOf(error: unknown): { message: string, fieldErrors: Record<string, string> } {
  const e = error as FetchError<{ statusMessage?: string, message?: string, data?: { fieldErrors?: Record<string, string> } }>
  const body = e?.data
  const fieldErrors = body?.data?.fieldErrors ?? {}
  // Routes put the sentence in `message` (see server/utils/errors.ts); statusMessage is only the HTTP reason.
  const given = body?.message || e?.statusMessage || ''
  if (given && !REASON_PHRASE.test(given.trim())) return { message: given, fieldErrors }
  return { message: plainSentence(e?.statusCode), fieldErrors }
}

function plainSentence(status: number | undefined) {
  if (status === undefined) return 'The server could not be reached. Check the connection and try again in a moment.'
  if (status === 401) return 'Your session has ended. Sign in again, then retry.'
  if (status === 403) return 'Your role may not do this. Ask your program administrator if you need it.'
  if (status === 404) return 'This record was not found. It may have been removed; reload the list.'
  if (status >= 500) return 'The server could not finish this request. Reload to see what was saved, then try again; if it keeps happening, tell your administrator.'
  return 'The request was refused. Check the fields and try again.'
}
