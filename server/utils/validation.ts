import type { H3Event } from 'h3'
import type { z } from 'zod'

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

export async function parseBody<S extends z.ZodType>(event: H3Event, schema: S): Promise<z.output<S>> {
  let body: unknown
  try {
    body = await readBody(event)
  } catch {
    throw httpError(400, 'The request body is not valid JSON.')
  }
  const result = schema.safeParse(body ?? {})
  return result.success ? result.data : invalid(result.error, 'form')
}

export function parseQuery<S extends z.ZodType>(event: H3Event, schema: S): z.output<S> {
  const result = schema.safeParse(getQuery(event))
  return result.success ? result.data : invalid(result.error, 'filters')
}

export function parseParams<S extends z.ZodType>(event: H3Event, schema: S): z.output<S> {
  const result = schema.safeParse(getRouterParams(event, { decode: true }))
  // A malformed id names nothing that exists: the same answer as a missing record.
  if (!result.success) {
    throw httpError(404, 'Not found.')
  }
  return result.data
}
