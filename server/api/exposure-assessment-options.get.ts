import { asc, eq } from 'drizzle-orm'
import { roleMay } from '#shared/utils/permissions'

/** What the calculator needs: the organization's rule set, its sites, and the roster to assign from. */
export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'read-program')
  const p = schema.people
  const [ruleSet, sites, people] = await Promise.all([
    assessmentRuleSetOf(caller.organizationId),
    listSites(caller.organizationId),
    useDb().select({ id: p.id, fullName: p.fullName, jobTitle: p.jobTitle, active: p.active }).from(p).where(eq(p.organizationId, caller.organizationId)).orderBy(asc(p.fullName))
  ])
  const active = people.filter(x => x.active)
  const jobTitles = [...new Set(active.map(x => x.jobTitle?.trim()).filter((x): x is string => Boolean(x)))].sort()
  return {
    ruleSet,
    canWrite: roleMay(caller.role, 'review'),
    sites: sites.map(s => ({ id: s.id, name: s.name })),
    people: active.map(x => ({ id: x.id, fullName: x.fullName, jobTitle: x.jobTitle })),
    jobTitles
  }
})
