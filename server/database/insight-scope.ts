import { sql } from 'drizzle-orm'
import type { SQL } from 'drizzle-orm'
import type { InsightFilters } from '../../shared/utils/insight-schemas'

// What every insights query shares. Plain TypeScript (no Nitro), so the benchmark, the demo seed
// and the admin's rebuild script run exactly the SQL the routes run.

/** Anything that runs raw SQL: the app's pool, a transaction, or a script's own connection. */
export interface SqlRunner {
  execute(query: SQL): Promise<{ rows: unknown[] }>
}

/** A runner that can also open a transaction: the app's pool, or a script's drizzle. */
export interface TransactionalRunner extends SqlRunner {
  transaction<T>(run: (tx: SqlRunner) => Promise<T>): Promise<T>
}

/**
 * Runs one panel's queries in a transaction of their own with enough sort and hash memory
 * (`work_mem`) that grouping a whole organization's results stays in memory instead of spilling
 * to disk. SET LOCAL ends with the transaction, so other queries on the same connection keep the
 * server's defaults.
 */
export function insightRead<T>(db: TransactionalRunner, run: (tx: SqlRunner) => Promise<T>): Promise<T> {
  return db.transaction(async (tx) => {
    // One snapshot for a panel's few statements (zonesCurrent, then the panel's own).
    await tx.execute(sql.raw('set transaction isolation level repeatable read, read only'))
    await tx.execute(sql.raw(`set local work_mem = '${INSIGHT_WORK_MEM}'`))
    return run(tx)
  })
}
export const INSIGHT_WORK_MEM = '32MB'

/** The insight_results column holding a canonical movement's penetration share. */
export const shareColumn = (movement: string) => `share_${movement.replace(/-/g, '_')}`

export async function rows<T>(db: SqlRunner, query: SQL): Promise<T[]> {
  const result = await db.execute(query)
  return result.rows as T[]
}

export const int = (v: unknown) => Number(v ?? 0)
export const num = (v: unknown) => (v === null || v === undefined ? null : Number(v))

/**
 * The WHERE of every panel over the summary `insight_results f`: the caller's organization and the
 * filters. The summary holds only current finished results with a verdict.
 */
export function factScope(organizationId: string, f: InsightFilters, opts: { ignoreTester?: boolean } = {}): SQL {
  const parts: SQL[] = [sql`f.organization_id = ${organizationId}`]
  if (f.siteId) parts.push(sql`f.site_id = ${f.siteId}`)
  if (f.from) parts.push(sql`f.performed_at >= (${f.from}::date::timestamp at time zone 'UTC')`)
  if (f.to) parts.push(sql`f.performed_at < ((${f.to}::date + 1)::timestamp at time zone 'UTC')`)
  if (f.protocolKey) parts.push(sql`f.protocol_key = ${f.protocolKey}`)
  if (f.respiratorModelId) parts.push(sql`f.respirator_model_id = ${f.respiratorModelId}`)
  if (f.respiratorSize) parts.push(sql`f.respirator_size = ${f.respiratorSize}`)
  if (f.testerUserId && !opts.ignoreTester) parts.push(sql`f.tester_user_id = ${f.testerUserId}`)
  return sql.join(parts, sql` and `)
}

/**
 * Whether a person-and-model series is whole under these filters: a model filter keeps or drops
 * whole series and an end date only cuts off their later tests, so a first attempt stays first and
 * the stored per-series results (first attempts, drift) hold. Any other filter can remove a
 * series' earlier tests, so the panel works them out again from the filtered rows.
 */
export function keepsWholeSeries(f: InsightFilters): boolean {
  return !f.siteId && !f.from && !f.protocolKey && !f.respiratorSize && !f.testerUserId
}

/**
 * The calendar day of a summary row `f` (or of its last readiness check) in the time zone of its
 * site `st`: stored when the row was made, worked out again if the site's zone changed since.
 */
export const localDayOf = sql`(case when f.time_zone = st.time_zone then f.local_day else (f.performed_at at time zone st.time_zone)::date end)`
export const checkLocalDayOf = sql`(case when f.time_zone = st.time_zone then f.last_check_local_day else (f.last_check_at at time zone st.time_zone)::date end)`

/**
 * Whether every summary row of the organization still carries its site's current time zone — the
 * usual case, as a site's zone seldom changes. Then the stored local days hold as they are and a
 * panel needs no join to the sites (localDays).
 */
export async function zonesCurrent(db: SqlRunner, organizationId: string): Promise<boolean> {
  // The least and greatest zone per site: two reads at either end of the zone index.
  const [r] = await rows<{ stale: boolean }>(db, sql`
    select coalesce(bool_or(z.lo <> st.time_zone or z.hi <> st.time_zone), false) as stale
    from sites st
    cross join lateral (
      select min(f.time_zone) as lo, max(f.time_zone) as hi from insight_results f
      where f.organization_id = st.organization_id and f.site_id = st.id
    ) z
    where st.organization_id = ${organizationId}`)
  return r?.stale === false
}

/**
 * The calendar days of a summary row `f` and of its last readiness check (localDayOf and
 * checkLocalDayOf), with the join to the sites they need: none when the zones are current.
 */
export async function localDays(db: SqlRunner, organizationId: string) {
  return await zonesCurrent(db, organizationId)
    ? { day: sql`f.local_day`, checkDay: sql`f.last_check_local_day`, sites: sql`` }
    : { day: localDayOf, checkDay: checkLocalDayOf, sites: sql`join sites st on st.id = f.site_id` }
}

/** A person's first result on a model among the rows in scope, as SQL over `f`. */
export function firstAttemptOf(f: InsightFilters): SQL {
  return keepsWholeSeries(f)
    ? sql`f.first_attempt`
    : sql`row_number() over (partition by f.person_id, f.respirator_model_id order by f.performed_at, f.fit_test_id) = 1`
}

/** The same WHERE over the raw revisions `fit_tests ft`: current finished results with a verdict. */
export function insightScope(organizationId: string, f: InsightFilters, opts: { ignoreTester?: boolean } = {}): SQL {
  const parts: SQL[] = [
    sql`ft.organization_id = ${organizationId}`,
    sql`ft.status = 'finished'`,
    sql`ft.passed is not null`
  ]
  if (f.siteId) parts.push(sql`ft.site_id = ${f.siteId}`)
  if (f.from) parts.push(sql`ft.performed_at >= (${f.from}::date::timestamp at time zone 'UTC')`)
  if (f.to) parts.push(sql`ft.performed_at < ((${f.to}::date + 1)::timestamp at time zone 'UTC')`)
  if (f.protocolKey) parts.push(sql`ft.protocol_key = ${f.protocolKey}`)
  if (f.respiratorModelId) parts.push(sql`ft.respirator_model_id = ${f.respiratorModelId}`)
  if (f.respiratorSize) parts.push(sql`ft.respirator_size = ${f.respiratorSize}`)
  if (f.testerUserId && !opts.ignoreTester) parts.push(sql`ft.tester_user_id = ${f.testerUserId}`)
  return sql.join(parts, sql` and `)
}

/** One drifting person and model, decoded from a drift query's row (the summary's and the raw reference's alike). */
export function driftPersonOf(x: Record<string, unknown>) {
  return {
    personId: String(x.person_id),
    personName: String(x.full_name),
    employeeNumber: x.employee_number === null ? null : String(x.employee_number),
    respiratorModelId: String(x.respirator_model_id),
    make: String(x.respirator_make),
    model: String(x.respirator_model),
    size: String(x.respirator_size),
    tests: int(x.tests),
    slopePerYear: Number(x.slope),
    latestFitFactor: Math.exp(Number(x.latest_y)),
    medianFitFactor: Math.exp(Number(x.median_y)),
    predictedAtDue: Number(x.predicted_at_due),
    nextDueOn: String(x.next_due_on instanceof Date ? x.next_due_on.toISOString().slice(0, 10) : x.next_due_on),
    passLevel: Number(x.pass_level),
    latestBelowOwnMedian: Boolean(x.below_median),
    predictsFailBeforeDue: Boolean(x.predicts_fail),
    series: (x.series as unknown[]).map(Number),
    dates: (x.dates as unknown[]).map(String)
  }
}
