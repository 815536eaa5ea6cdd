import { and, between, eq, or, sql } from 'drizzle-orm'
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
 * Coverage of many results at once (a list page): one query for the counters and the checks of
 * the whole span (the sites come with the caller), then the same pure rule per result.
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
  const k = schema.counters
  const from = new Date(Math.min(...times) - 2 * DAY_MS).toISOString()
  const to = new Date(Math.max(...times) + 2 * DAY_MS).toISOString()
  const [sites, { rows: [loaded] }] = await Promise.all([
    listSites(organizationId),
    useDb().execute<{ counters: { id: string, calibrationDueOn: string | null }[], checks: { id: string, counterId: string, benchRigId: string | null, status: string, completedAt: string | null }[] }>(sql`select
      (select coalesce(json_agg(json_build_object('id', ${k.id}, 'calibrationDueOn', ${k.calibrationDueOn})), '[]'::json) from ${k} where ${k.organizationId} = ${organizationId}) as counters,
      (select coalesce(json_agg(json_build_object('id', ${c.id}, 'counterId', ${c.counterId}, 'benchRigId', ${c.benchRigId}, 'status', ${c.status}, 'completedAt', ${c.completedAt})), '[]'::json)
        from ${c} where ${c.organizationId} = ${organizationId} and ${c.completedAt} between ${from}::timestamptz and ${to}::timestamptz) as checks`)
  ])
  return coverageOfMany(measured, sites, loaded!.counters, loaded!.checks)
}

type LoadedCheck = { id: string, counterId: string, benchRigId: string | null, status: string, completedAt: string | Date | null }

/**
 * The coverage rule applied to many results, given the sites (time zones), the counters'
 * calibration dates and the readiness checks loaded for them (completion times as JSON gives them).
 */
export function coverageOfMany(
  results: { id: string, counterId: string | null, siteId: string | null, performedAt: Date }[],
  sites: { id: string, timeZone: string }[],
  counters: { id: string, calibrationDueOn: string | null }[],
  loadedChecks: LoadedCheck[]
): Map<string, Coverage> {
  const out = new Map<string, Coverage>()
  const checks = loadedChecks.map(check => ({ ...check, completedAt: check.completedAt === null ? null : new Date(check.completedAt) }))
  const zone = new Map(sites.map(s => [s.id, s.timeZone]))
  const calibration = new Map(counters.map(k => [k.id, k]))
  // Checks sorted by time, so each result looks only at the ±2-day slice around it.
  const sorted = checks.filter(k => k.completedAt).sort((a, b) => a.completedAt!.getTime() - b.completedAt!.getTime())
  const checkTimes = sorted.map(k => k.completedAt!.getTime())
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
  for (const r of results) {
    if (!r.counterId) continue
    const at = new Date(r.performedAt).getTime()
    const near = sorted.slice(firstAtOrAfter(at - 2 * DAY_MS), firstAtOrAfter(at + 2 * DAY_MS + 1))
    out.set(r.id, decideCoverage({ counterId: r.counterId, benchRigId: null, performedAt: r.performedAt, timeZone: (r.siteId && zone.get(r.siteId)) || 'UTC' }, near, calibration.get(r.counterId) ?? null))
  }
  return out
}
