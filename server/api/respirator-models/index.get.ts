import { z } from 'zod'

const querySchema = z.object({ includeRetired: z.enum(['true', 'false']).optional() })

export default defineEventHandler(async (event) => {
  const caller = await requireRole(event)
  const query = parseQuery(event, querySchema)
  return listRespiratorModels(caller.organizationId, { includeRetired: query.includeRetired === 'true' })
})
