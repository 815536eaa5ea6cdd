import type { z } from 'zod'

/** Validates with the same zod schema the route uses; returns field → first message, or null when valid. */
export function validateWith<S extends z.ZodType>(schema: S, values: unknown): { data: z.output<S>, errors: null } | { data: null, errors: Record<string, string> } {
  const result = schema.safeParse(values)
  if (result.success) return { data: result.data, errors: null }
  const errors: Record<string, string> = {}
  for (const issue of result.error.issues) {
    errors[issue.path.join('.') || '_'] ??= issue.message
  }
  return { data: null, errors }
}
