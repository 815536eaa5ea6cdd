import type { H3Event } from 'h3'
import type { z } from 'zod'
import { findUnstorableText, UNSTORABLE_TEXT_MESSAGES } from '#shared/utils/storable-text'

/** Field path → first message, the shape every form shows beside its fields. */
export type FieldErrors = Record<string, string>

export function fieldErrorsOf(error: z.ZodError): FieldErrors {
  const out: FieldErrors = {}
  for (const issue of error.issues) {
    const path = issue.path.join('.') || '_'
    out[path] ??= issue.message
  }
  return out
}

function invalid(error: z.ZodError, what: string): never {
  const fieldErrors = fieldErrorsOf(error)
  const first = Object.values(fieldErrors)[0] ?? 'is not valid'
  throw httpError(400, `Check the ${what}: ${first}`, { fieldErrors })
}

/**
 * Refuses, before any schema runs, a request whose text could not be stored as typed: a NUL or a
 * lone surrogate anywhere (values and keys), or nesting deeper than any form sends. Every route
 * that reads input through these helpers gets the check.
 */
function refuseUnstorable(input: unknown, what: string) {
  const found = findUnstorableText(input)
  if (!found) return
  if ('tooDeep' in found) {
    throw httpError(400, `Check the ${what}: it is nested deeper than any form of ours sends.`, { fieldErrors: { [found.path]: 'Nested too deeply.' } })
  }
  const message = UNSTORABLE_TEXT_MESSAGES[found.reason]
  const field = found.path === '_' ? 'the request' : `'${found.path}'`
  throw httpError(400, `Check the ${what}: ${field} — ${message}`, { fieldErrors: { [found.path]: message } })
}

function isEmptyChange(data: unknown): boolean {
  return data !== null && typeof data === 'object' && !Array.isArray(data) && Object.values(data).every(v => v === undefined)
}

export async function parseBody<S extends z.ZodType>(event: H3Event, schema: S): Promise<z.output<S>> {
  let body: unknown
  try {
    body = await readBody(event)
  } catch {
    throw httpError(400, 'The request body is not valid JSON.')
  }
  refuseUnstorable(body, 'form')
  const result = schema.safeParse(body ?? {})
  if (!result.success) return invalid(result.error, 'form')
  // A change that names nothing to change is refused here, for every PATCH route, rather than
  // reaching an UPDATE with no columns.
  if (event.method === 'PATCH' && isEmptyChange(result.data)) {
    throw httpError(400, 'Nothing to change: send at least one field.')
  }
  return result.data
}

export function parseQuery<S extends z.ZodType>(event: H3Event, schema: S): z.output<S> {
  const query = getQuery(event)
  refuseUnstorable(query, 'filters')
  const result = schema.safeParse(query)
  return result.success ? result.data : invalid(result.error, 'filters')
}

export function parseParams<S extends z.ZodType>(event: H3Event, schema: S): z.output<S> {
  const params = getRouterParams(event, { decode: true })
  const result = schema.safeParse(params)
  // A malformed id names nothing that exists: the same answer as a missing record.
  if (!result.success || findUnstorableText(params)) {
    throw httpError(404, 'Not found.')
  }
  return result.data
}
