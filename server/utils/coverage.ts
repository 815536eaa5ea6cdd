import { and, between, eq, or } from 'drizzle-orm'
import { decideCoverage } from '#shared/utils/coverage'
import type { Coverage } from '#shared/utils/coverage'

const DAY_MS = 86_400_000

/**
 * Whether a passing readiness check covers a result (fit test or headform test). Loads the checks
 * of that counter or rig from a window wide enough for any time zone, and the counter's
 * calibration date, then lets the pure rule in shared/utils/coverage.ts decide.
 */
export async function findCoverage(
  organizationId: string,
  result: { counterId: string, benchRigId?: string | null, siteId: string | null, performedAt: Date }
): Promise<Coverage> {
  const c = schema.readinessChecks
  const performedAt = new Date(result.performedAt)
  const [timeZone, counterRows, checks] = await Promise.all([
    siteTimeZone(organizationId, result.siteId),
    useDb().select({ calibrationDueOn: schema.counters.calibrationDueOn }).from(schema.counters)
      .where(and(eq(schema.counters.organizationId, organizationId), eq(schema.counters.id, result.counterId))),
    useDb().select({ id: c.id, counterId: c.counterId, benchRigId: c.benchRigId, status: c.status, completedAt: c.completedAt }).from(c)
      .where(and(
        eq(c.organizationId, organizationId),
        result.benchRigId ? or(eq(c.counterId, result.counterId), eq(c.benchRigId, result.benchRigId)) : undefined,
        between(c.completedAt, new Date(performedAt.getTime() - 2 * DAY_MS), new Date(performedAt.getTime() + 2 * DAY_MS))
      ))
  ])
  return decideCoverage(
    { counterId: result.counterId, benchRigId: result.benchRigId ?? null, performedAt, timeZone },
    checks,
    counterRows[0] ?? null
  )
}

/**
 * Coverage of many results at once (a list page): one query for the checks of the whole span,
 * one for the counters, then the same pure rule per result.
 */
export async function findCoverageMany(
  organizationId: string,
  results: { id: string, counterId: string | null, siteId: string | null, performedAt: Date }[]
): Promise<Map<string, Coverage>> {
  const out = new Map<string, Coverage>()
  const measured = results.filter((r): r is typeof r & { counterId: string } => Boolean(r.counterId))
  if (measured.length === 0) return out
  const times = measured.map(r => new Date(r.performedAt).getTime())
  const c = schema.readinessChecks
  const [sites, counters, checks] = await Promise.all([
    listSites(organizationId),
    useDb().select({ id: schema.counters.id, calibrationDueOn: schema.counters.calibrationDueOn }).from(schema.counters)
      .where(eq(schema.counters.organizationId, organizationId)),
    useDb().select({ id: c.id, counterId: c.counterId, benchRigId: c.benchRigId, status: c.status, completedAt: c.completedAt }).from(c)
      .where(and(eq(c.organizationId, organizationId), between(c.completedAt, new Date(Math.min(...times) - 2 * DAY_MS), new Date(Math.max(...times) + 2 * DAY_MS))))
  ])
  const zone = new Map(sites.map(s => [s.id, s.timeZone]))
  const calibration = new Map(counters.map(k => [k.id, k]))
  // Checks sorted by time, so each result looks only at the ±2-day slice around it.
  const sorted = checks.filter(k => k.completedAt).sort((a, b) => new Date(a.completedAt!).getTime() - new Date(b.completedAt!).getTime())
  const checkTimes = sorted.map(k => new Date(k.completedAt!).getTime())
  const firstAtOrAfter = (t: number) => {
    let lo = 0
    let hi = checkTimes.length
    while (lo < hi) {
      const mid = (lo + hi) >> 1
      if (checkTimes[mid]! < t) lo = mid + 1
      else hi = mid
    }
    return lo
  }
  for (const r of measured) {
    const at = new Date(r.performedAt).getTime()
    const near = sorted.slice(firstAtOrAfter(at - 2 * DAY_MS), firstAtOrAfter(at + 2 * DAY_MS + 1))
    out.set(r.id, decideCoverage({ counterId: r.counterId, benchRigId: null, performedAt: r.performedAt, timeZone: (r.siteId && zone.get(r.siteId)) || 'UTC' }, near, calibration.get(r.counterId) ?? null))
  }
  return out
}
