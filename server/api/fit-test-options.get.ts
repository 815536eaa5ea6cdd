import { and, asc, eq, ne } from 'drizzle-orm'
import { retestIntervalMonths } from '#shared/utils/fit-test-evaluate'

/** What the new-test form offers: the roster, catalogue, counters, sites, protocols and rules. */
export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'read-program')
  const db = useDb()
  const [org, sites, models, counters, people, units] = await Promise.all([
    findOrganization(caller.organizationId),
    listSites(caller.organizationId),
    listRespiratorModels(caller.organizationId),
    db.select().from(schema.counters).where(and(eq(schema.counters.organizationId, caller.organizationId), eq(schema.counters.active, true))).orderBy(asc(schema.counters.serialNumber)),
    db.select({ id: schema.people.id, fullName: schema.people.fullName, employeeNumber: schema.people.employeeNumber, siteId: schema.people.siteId, medicalClearanceStatus: schema.people.medicalClearanceStatus, medicalClearanceOn: schema.people.medicalClearanceOn })
      .from(schema.people).where(and(eq(schema.people.organizationId, caller.organizationId), eq(schema.people.active, true))).orderBy(asc(schema.people.fullName)),
    // Units tracked by serial: a test of their model names the unit worn; held ones are shown but cannot be chosen.
    db.select({ id: schema.maskUnits.id, serialNumber: schema.maskUnits.serialNumber, respiratorModelId: schema.maskUnits.respiratorModelId, size: schema.maskUnits.size, state: schema.maskUnits.state })
      .from(schema.maskUnits).where(and(eq(schema.maskUnits.organizationId, caller.organizationId), ne(schema.maskUnits.state, 'retired'))).orderBy(asc(schema.maskUnits.serialNumber))
  ])
  return {
    organization: { ruleSet: org.ruleSet, passLevelOverrides: org.settings.passLevelOverrides ?? null, retestIntervalMonths: retestIntervalMonths(org.settings.retestIntervalMonths) },
    sites: sites.map(s => ({ id: s.id, name: s.name, timeZone: s.timeZone })),
    respiratorModels: models.map(m => ({ id: m.id, make: m.make, model: m.model, respiratorClass: m.respiratorClass, sizes: m.sizes })),
    counters: counters.map(c => ({ id: c.id, serialNumber: c.serialNumber, description: c.description, sampleFlowCm3PerMin: c.sampleFlowCm3PerMin, calibrationDueOn: c.calibrationDueOn, siteId: c.siteId })),
    people,
    maskUnits: units,
    trackedModelIds: [...new Set((await db.select({ id: schema.maskUnits.respiratorModelId }).from(schema.maskUnits).where(eq(schema.maskUnits.organizationId, caller.organizationId))).map(r => r.id))],
    protocols: protocolsOffered(org)
  }
})
