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
