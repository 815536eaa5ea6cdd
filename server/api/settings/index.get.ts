export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'admin')
  return settingsView(await findOrganization(caller.organizationId))
})
