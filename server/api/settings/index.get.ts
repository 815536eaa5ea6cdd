export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'admin')
  const organization = await findOrganization(caller.organizationId)
  return { uncoveredResults: organization.settings.uncoveredResults ?? 'flag' }
})
