export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'read-program')
  return equipmentOverview(caller.organizationId)
})
