import type { H3Event } from 'h3'
import type { z } from 'zod'
import { hasChanges, NOTHING_TO_CHANGE } from '#shared/utils/patch-schema'

/**
 * The body of a partial edit (PATCH), parsed with a schema from `partialWithoutDefaults`: only the
 * fields sent are present, so the update changes exactly those. An empty edit is refused with a
 * sentence rather than reaching the database as an update of nothing.
 */
export async function parseChanges<S extends z.ZodType>(event: H3Event, schema: S): Promise<z.output<S>> {
  const changes = await parseBody(event, schema)
  if (!hasChanges(changes as Record<string, unknown>)) throw httpError(400, NOTHING_TO_CHANGE)
  return changes
}
