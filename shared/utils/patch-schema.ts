import { z } from 'zod'

type WithoutDefault<T> = T extends z.ZodDefault<infer Inner> ? Inner : T

function withoutDefault(field: z.ZodType): z.ZodType {
  return field instanceof z.ZodDefault ? (field.unwrap() as z.ZodType) : field
}

/**
 * Every field of a create schema made optional, with its `.default()` taken away. zod's own
 * `.partial()` keeps the defaults, so a partial edit that leaves a field out would quietly reset it
 * (a counter sent `{ active: false }` lost its description, site and calibration date). Here a
 * field left out of the body stays out of the update.
 */
export function partialWithoutDefaults<Shape extends z.ZodRawShape>(schema: z.ZodObject<Shape>) {
  const shape: Record<string, z.ZodType> = {}
  for (const [key, field] of Object.entries(schema.shape)) shape[key] = withoutDefault(field as z.ZodType).optional()
  return z.object(shape) as unknown as z.ZodObject<{ [K in keyof Shape]: z.ZodOptional<WithoutDefault<Shape[K]>> }>
}

export const NOTHING_TO_CHANGE = 'Nothing to change: send at least one field.'

/** True when a parsed partial edit names at least one field. */
export function hasChanges(changes: Record<string, unknown>): boolean {
  return Object.values(changes).some(value => value !== undefined)
}

/** The fields of a partial edit that were sent, ready to spread over the stored row. */
export function definedOnly<T extends object>(changes: T | undefined): Partial<T> {
  if (!changes) return {}
  return Object.fromEntries(Object.entries(changes).filter(([, value]) => value !== undefined)) as Partial<T>
}
