/** The rule set's pass levels and the organization's own; everyone who reads records may see them. */
export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'read-program')
  return passLevelView(await findOrganization(caller.organizationId))
})
