import type { FetchError } from 'ofetch'

/** The message and per-field messages a route sent, in the shape forms show. */
export function apiErrorOf(error: unknown): { message: string, fieldErrors: Record<string, string> } {
  const e = error as FetchError<{ statusMessage?: string, message?: string, data?: { fieldErrors?: Record<string, string> } }>
  const body = e?.data
  // Routes put the sentence in `message` (see server/utils/errors.ts); statusMessage is only the HTTP reason.
  const message = body?.message || e?.statusMessage || 'Something went wrong. Try again.'
  return { message, fieldErrors: body?.data?.fieldErrors ?? {} }
}
