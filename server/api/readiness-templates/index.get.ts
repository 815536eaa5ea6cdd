export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'read-program')
  return listTemplates(caller.organizationId)
})
