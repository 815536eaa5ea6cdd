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

/** An enum's values with their labels, as the choices of a FormSelectField. */
export function choicesOf<Value extends string>(values: readonly Value[], labels: Record<Value, string>): { value: Value, label: string }[] {
  return values.map(value => ({ value, label: labels[value] }))
}

/** The sites a piece of equipment can belong to, after "No fixed site" (null). */
export function siteChoices(sites: readonly { id: string, name: string }[]): { value: string | null, label: string }[] {
  return [{ value: null, label: 'No fixed site' }, ...sites.map(s => ({ value: s.id, label: s.name }))]
}
