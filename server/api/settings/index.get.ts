export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'administer')
  return settingsView(await findOrganization(caller.organizationId))
})
