import { and, asc, eq } from 'drizzle-orm'
import { retestIntervalMonths } from '#shared/utils/fit-test-evaluate'

/** What the new-test form offers: the roster, catalogue, counters, sites, protocols and rules. */
export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'tester', 'reviewer', 'trainer')
  const db = useDb()
  const [org, sites, models, counters, people] = await Promise.all([
    findOrganization(caller.organizationId),
    listSites(caller.organizationId),
    listRespiratorModels(caller.organizationId),
    db.select().from(schema.counters).where(and(eq(schema.counters.organizationId, caller.organizationId), eq(schema.counters.active, true))).orderBy(asc(schema.counters.serialNumber)),
    db.select({ id: schema.people.id, fullName: schema.people.fullName, employeeNumber: schema.people.employeeNumber, siteId: schema.people.siteId, medicalClearanceStatus: schema.people.medicalClearanceStatus, medicalClearanceOn: schema.people.medicalClearanceOn })
      .from(schema.people).where(and(eq(schema.people.organizationId, caller.organizationId), eq(schema.people.active, true))).orderBy(asc(schema.people.fullName))
  ])
  return {
    organization: { ruleSet: org.ruleSet, passLevelOverrides: org.settings.passLevelOverrides ?? null, retestIntervalMonths: retestIntervalMonths(org.settings.retestIntervalMonths) },
    sites: sites.map(s => ({ id: s.id, name: s.name, timeZone: s.timeZone })),
    respiratorModels: models.map(m => ({ id: m.id, make: m.make, model: m.model, respiratorClass: m.respiratorClass, sizes: m.sizes })),
    counters: counters.map(c => ({ id: c.id, serialNumber: c.serialNumber, description: c.description, sampleFlowCm3PerMin: c.sampleFlowCm3PerMin, calibrationDueOn: c.calibrationDueOn, siteId: c.siteId })),
    people,
    protocols: protocolsOffered(org)
  }
})
