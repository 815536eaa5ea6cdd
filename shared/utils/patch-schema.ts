/**
 * The fields of a partial edit that were sent, ready to spread over the stored value. Edit schemas
 * come from `changesSchema` (shared/utils/input-ranges.ts), which drops the create schema's
 * defaults, so a field left out of the body is absent here and stays as it was.
 */
export function definedOnly<T extends object>(changes: T | undefined): Partial<T> {
  if (!changes) return {}
  return Object.fromEntries(Object.entries(changes).filter(([, value]) => value !== undefined)) as Partial<T>
}
