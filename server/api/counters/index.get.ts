import { listEquipmentQuerySchema } from '#shared/utils/equipment-schemas'

export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'read-program')
  const query = parseQuery(event, listEquipmentQuerySchema)
  return listCounters(caller.organizationId, { includeRetired: query.includeRetired === 'true' })
})
