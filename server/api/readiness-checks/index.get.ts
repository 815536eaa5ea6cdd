import { listChecksQuerySchema } from '#shared/utils/readiness-schemas'

export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'read-program')
  const query = parseQuery(event, listChecksQuerySchema)
  return listChecks(caller.organizationId, query)
})
