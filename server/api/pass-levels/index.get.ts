/** The rule set's pass levels and the organization's own; everyone who reads records may see them. */
export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'tester', 'reviewer', 'trainer')
  return passLevelView(await findOrganization(caller.organizationId))
})
