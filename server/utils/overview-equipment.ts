import { and, eq, gte } from 'drizzle-orm'
import { calibrationState } from '#shared/utils/calibration'
import { latestDay, localDay } from '#shared/utils/clock'
import { decideCoverage } from '#shared/utils/coverage'

const DAY_MS = 86_400_000
const RETEST_LOOKAHEAD_DAYS = 14

/** Today's readiness per counter and rig (in each site's zone), held units, calibrations and retests due. */
export async function equipmentOverview(organizationId: string) {
  const now = new Date()
  const c = schema.readinessChecks
  const [counters, rigs, units, sites, checks] = await Promise.all([
    listCounters(organizationId),
    listBenchRigs(organizationId),
    listMaskUnits(organizationId, {}),
    listSites(organizationId),
    useDb().select({ id: c.id, counterId: c.counterId, benchRigId: c.benchRigId, status: c.status, completedAt: c.completedAt }).from(c)
      .where(and(eq(c.organizationId, organizationId), gte(c.startedAt, new Date(now.getTime() - 2 * DAY_MS))))
  ])
  const zoneOf = (siteId: string | null) => sites.find(s => s.id === siteId)?.timeZone ?? 'UTC'
  const readiness = [
    ...counters.map(k => ({ kind: 'counter' as const, id: k.id, serialNumber: k.serialNumber, siteName: k.siteName, coverage: decideCoverage({ counterId: k.id, performedAt: now, timeZone: zoneOf(k.siteId) }, checks, k) })),
    ...rigs.map(r => ({ kind: 'bench-rig' as const, id: r.id, serialNumber: r.serialNumber, siteName: r.siteName, coverage: decideCoverage({ counterId: r.counterId, benchRigId: r.id, performedAt: now, timeZone: zoneOf(r.siteId) }, checks, counters.find(k => k.id === r.counterId)) }))
  ]
  const calibrations = counters
    .map(k => ({ id: k.id, serialNumber: k.serialNumber, calibrationDueOn: k.calibrationDueOn, ...calibrationState(k.calibrationDueOn, localDay(now, zoneOf(k.siteId))) }))
    .filter(k => k.state === 'due-soon' || k.state === 'past-due')
  const latestToday = latestDay(now, sites.map(s => s.timeZone))
  const horizon = new Date(now.getTime() + RETEST_LOOKAHEAD_DAYS * DAY_MS).toISOString().slice(0, 10)
  const pick = (u: typeof units[number]) => ({ id: u.id, serialNumber: u.serialNumber, model: `${u.make} ${u.model}`, headformDueOn: u.headformDueOn })
  return {
    readiness,
    held: units.filter(u => u.state === 'held').map(pick),
    calibrations,
    // Overdue once the day it was due has passed where the unit is kept (a unit with no site: in
    // whichever of the program's zones is furthest ahead, so it never reads as not yet overdue).
    retestsDue: units.filter(u => u.state === 'in-service' && u.headformDueOn && u.headformDueOn <= horizon)
      .map(u => ({ ...pick(u), overdue: u.headformDueOn! < (u.siteId ? localDay(now, zoneOf(u.siteId)) : latestToday) })),
    retestLookaheadDays: RETEST_LOOKAHEAD_DAYS
  }
}
