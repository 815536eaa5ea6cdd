export default defineEventHandler(async (event) => {
  const caller = await requireRole(event)
  const [organization, sites] = await Promise.all([
    findOrganization(caller.organizationId),
    listSites(caller.organizationId)
  ])
  return {
    organization: { id: organization.id, name: organization.name, ruleSet: organization.ruleSet },
    sites: sites.map(s => ({ id: s.id, name: s.name, timeZone: s.timeZone, address: s.address })),
    you: { displayName: caller.displayName, email: caller.email, role: caller.role }
  }
})
