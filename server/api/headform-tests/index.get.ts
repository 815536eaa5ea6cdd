import { z } from 'zod'

const querySchema = z.object({ maskUnitId: z.uuid().optional(), limit: z.coerce.number().int().min(1).max(200).default(50) })

export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'read-program')
  const query = parseQuery(event, querySchema)
  return listHeadformTests(caller.organizationId, query)
})
