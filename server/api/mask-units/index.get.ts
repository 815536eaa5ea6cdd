import { listMaskUnitsQuerySchema } from '#shared/utils/mask-schemas'

export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'read-program')
  const query = parseQuery(event, listMaskUnitsQuerySchema)
  return listMaskUnits(caller.organizationId, query)
})
