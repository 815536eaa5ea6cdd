export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'tester', 'reviewer', 'trainer')
  return listMaskTypes(caller.organizationId)
})
