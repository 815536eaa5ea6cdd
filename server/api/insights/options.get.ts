import { and, asc, eq, inArray } from 'drizzle-orm'
import { BUILT_IN_PROTOCOLS } from '#shared/utils/compute'

/** What the insights filters offer: sites, protocols, respirator models with sizes, testers. */
export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'see-insights')
  const db = useDb()
  const u = schema.users
  const [org, sites, models, testers] = await Promise.all([
    findOrganization(caller.organizationId),
    listSites(caller.organizationId),
    listRespiratorModels(caller.organizationId),
    db.select({ id: u.id, displayName: u.displayName }).from(u)
      .where(and(eq(u.organizationId, caller.organizationId), inArray(u.role, ['tester', 'admin']))).orderBy(asc(u.displayName))
  ])
  return {
    organization: { name: org.name, ruleSet: org.ruleSet },
    sites: sites.map(s => ({ id: s.id, name: s.name })),
    protocols: BUILT_IN_PROTOCOLS.map(p => ({ key: p.key, name: p.name })),
    respiratorModels: models.map(m => ({ id: m.id, make: m.make, model: m.model, sizes: m.sizes })),
    testers
  }
})
