import { sql } from 'drizzle-orm'
import type { SQL } from 'drizzle-orm'
import { CANONICAL_MOVEMENTS } from '../../shared/utils/compute/movements'
import { storeDriftSql } from './insight-drift'
import { int, rows, shareColumn } from './insight-scope'
import type { SqlRunner } from './insight-scope'

// Keeps the insights summary (insight_results, insight_drift; schema/insights.ts) in step with
// the raw rows. One entry point for the write paths — finishing a revision (a first result or a
// correction, which supersedes the one before) and withdrawing — and one for rebuilding a whole
// organization; both run the same statements, so the rebuilt summary is the maintained one.

const canonicalList = sql.raw(`array[${CANONICAL_MOVEMENTS.map(m => `'${m}'`).join(', ')}]::text[]`)
const shareColumns = sql.raw(CANONICAL_MOVEMENTS.map(shareColumn).join(', '))
const canonicalShares = sql.raw(CANONICAL_MOVEMENTS.map(m => `max(share) filter (where movement = '${m}') as ${shareColumn(m)}`).join(', '))
const sharesOf = (alias: string) => sql.raw(CANONICAL_MOVEMENTS.map(m => `${alias}.${shareColumn(m)}`).join(', '))
/** A summary row `r` without any exercise share (no exercise rows when it was made). */
const withoutShares = sql.raw(`coalesce(${CANONICAL_MOVEMENTS.map(m => `r.${shareColumn(m)}`).join(', ')}) is null and r.other_shares is null`)

/** Inserts the summary row of every current finished revision with a verdict among `target` (over fit_tests ft). */
export function insertResults(organizationId: string, target: SQL): SQL {
  return sql`
    with target as (
      select ft.* from fit_tests ft
      where ft.organization_id = ${organizationId} and ${target} and ft.status = 'finished' and ft.passed is not null
    ),
    -- The last readiness check of the same counter that ended at or before each result: one
    -- ordered pass over the counter's checks and these results (the coverage rule of
    -- shared/utils/coverage.ts; the same day and calibration are judged when a panel runs).
    events as (
      select rc.counter_id, rc.completed_at as at, 0 as kind, rc.status = 'passed' as check_passed, null::uuid as fit_test_id
      from readiness_checks rc
      where rc.organization_id = ${organizationId} and rc.status in ('passed', 'failed') and rc.completed_at is not null
        and rc.counter_id in (select distinct counter_id from target)
      union all
      select counter_id, performed_at, 1, null, id from target where counter_id is not null
    ),
    numbered as (
      select *, count(*) filter (where kind = 0) over (partition by counter_id order by at, kind rows unbounded preceding) as grp
      from events
    ),
    checked as (
      select fit_test_id, first_value(kind) over w as first_kind, first_value(check_passed) over w as check_passed, first_value(at) over w as check_at
      from numbered window w as (partition by counter_id, grp order by kind, at)
    ),
    movements as (
      select e.fit_test_id, e.movement, sum(e.penetration_share) as share, bool_or(e.is_limiting) as limiting
      from fit_test_exercise_results e
      where e.organization_id = ${organizationId} and e.fit_test_id in (select id from target)
      group by 1, 2
    ),
    shares as (
      select fit_test_id, ${canonicalShares},
        jsonb_object_agg(movement, share) filter (where movement <> all(${canonicalList})) as other_shares,
        min(movement) filter (where limiting) as limiting_movement
      from movements group by 1
    )
    insert into insight_results (fit_test_id, organization_id, site_id, person_id, tester_user_id, counter_id, respirator_model_id,
      respirator_make, respirator_model, respirator_size, protocol_key, performed_at, passed, ln_fit_factor, overall_is_lower_bound,
      pass_level, due_on, first_attempt, last_check_at, last_check_passed, limiting_movement, ${shareColumns}, other_shares,
      time_zone, local_day, last_check_local_day)
    select t.id, t.organization_id, t.site_id, t.person_id, t.tester_user_id, t.counter_id, t.respirator_model_id,
      t.respirator_make, t.respirator_model, t.respirator_size, t.protocol_key, t.performed_at, t.passed,
      case when t.overall_fit_factor > 0 then ln(t.overall_fit_factor) end, t.overall_is_lower_bound,
      t.pass_level, t.due_on, false,
      case when c.first_kind = 0 then c.check_at end, case when c.first_kind = 0 then c.check_passed end,
      s.limiting_movement, ${sharesOf('s')}, s.other_shares,
      st.time_zone, (t.performed_at at time zone st.time_zone)::date, case when c.first_kind = 0 then (c.check_at at time zone st.time_zone)::date end
    from target t
    join sites st on st.id = t.site_id
    left join checked c on c.fit_test_id = t.id
    left join shares s on s.fit_test_id = t.id`
}

/** Marks each series' first result (earliest, then by id) among the series `series` selects (over insight_results f). */
export function markFirstAttempts(organizationId: string, series: SQL): SQL {
  return sql`
    update insight_results r set first_attempt = (r.fit_test_id = x.first_id)
    from (
      select distinct on (f.person_id, f.respirator_model_id) f.person_id, f.respirator_model_id, f.fit_test_id as first_id
      from insight_results f where f.organization_id = ${organizationId} and ${series}
      order by f.person_id, f.respirator_model_id, f.performed_at, f.fit_test_id
    ) x
    where r.organization_id = ${organizationId} and r.person_id = x.person_id and r.respirator_model_id = x.respirator_model_id
      and r.first_attempt <> (r.fit_test_id = x.first_id)`
}

/**
 * Brings the summary in step with the given records after a write: call it inside the writing
 * transaction, after the revision's status and exercise rows are saved. Every person-and-model
 * series a revision of these records belongs to (before or after a correction) is worked out
 * again, under a lock per series so that two results finished at once for one person and model
 * both count.
 */
export async function refreshInsightFacts(tx: SqlRunner, organizationId: string, recordIds: string[]) {
  if (recordIds.length === 0) return
  const records = sql`ft.record_id in (${sql.join(recordIds.map(id => sql`${id}::uuid`), sql`, `)})`
  const pairs = await rows<{ person_id: string, respirator_model_id: string }>(tx, sql`
    select distinct ft.person_id, ft.respirator_model_id from fit_tests ft
    where ft.organization_id = ${organizationId} and ${records} order by 1, 2`)
  for (const p of pairs) {
    await tx.execute(sql`select pg_advisory_xact_lock(hashtextextended(${`insight-series:${p.person_id}:${p.respirator_model_id}`}, 0))`)
  }
  const series = sql`(f.person_id, f.respirator_model_id) in (${sql.join(pairs.map(p => sql`(${p.person_id}::uuid, ${p.respirator_model_id}::uuid)`), sql`, `)})`
  await tx.execute(sql`delete from insight_results where organization_id = ${organizationId}
    and fit_test_id in (select ft.id from fit_tests ft where ft.organization_id = ${organizationId} and ${records})`)
  await tx.execute(insertResults(organizationId, records))
  await tx.execute(markFirstAttempts(organizationId, series))
  await tx.execute(sql`delete from insight_drift f where f.organization_id = ${organizationId} and ${series}`)
  await tx.execute(storeDriftSql(sql`f.organization_id = ${organizationId} and ${series}`))
}

/**
 * Rebuilds one organization's summary from the raw rows (or every organization's when none is
 * named), each in one transaction that holds off writes to the summary meanwhile. For the demo
 * seed, the benchmark, results loaded by other means, and `npm run insights:rebuild`.
 * Returns how many results the summary holds afterwards.
 */
export async function rebuildInsightFacts(db: SqlRunner & { transaction<T>(run: (tx: SqlRunner) => Promise<T>): Promise<T> }, organizationId?: string): Promise<number> {
  const ids = organizationId
    ? [organizationId]
    : (await rows<{ id: string }>(db, sql`select id from organizations order by id`)).map(o => o.id)
  let total = 0
  for (const id of ids) {
    total += await db.transaction(async (tx) => {
      await tx.execute(sql`lock table insight_results, insight_drift in share row exclusive mode`)
      await tx.execute(sql`delete from insight_results where organization_id = ${id}`)
      await tx.execute(sql`delete from insight_drift where organization_id = ${id}`)
      await tx.execute(sql`set local work_mem = '64MB'`)
      await tx.execute(insertResults(id, sql`true`))
      // Fresh statistics, or the planner takes the new rows for a handful and loops over them.
      await tx.execute(sql`analyze insight_results`)
      await tx.execute(markFirstAttempts(id, sql`true`))
      await tx.execute(storeDriftSql(sql`f.organization_id = ${id}`))
      return int((await rows<{ n: unknown }>(tx, sql`select count(*) as n from insight_results where organization_id = ${id}`))[0]?.n)
    })
  }
  return total
}

/**
 * Brings in the records whose summary is missing or stale — results loaded without the finish
 * route (imports, an older database) or whose exercise rows were filled afterwards — a batch of
 * records at a time. Returns how many records it refreshed.
 */
export async function refreshStaleInsightFacts(db: SqlRunner & { transaction<T>(run: (tx: SqlRunner) => Promise<T>): Promise<T> }, batch = 200): Promise<number> {
  let refreshed = 0
  // A record that stays stale after its refresh (it should not) is not tried again.
  const seen = new Set<string>()
  for (;;) {
    const stale = await rows<{ organization_id: string, record_id: string }>(db, sql`
      select distinct ft.organization_id, ft.record_id from fit_tests ft
      left join insight_results r on r.fit_test_id = ft.id
      where (ft.status = 'finished' and ft.passed is not null and (r.fit_test_id is null
          or (${withoutShares} and exists (select 1 from fit_test_exercise_results e where e.fit_test_id = ft.id))))
        or (r.fit_test_id is not null and ft.status <> 'finished')
      limit ${batch}`)
    const fresh = stale.filter(s => !seen.has(s.record_id))
    if (fresh.length === 0) return refreshed
    const byOrganization = new Map<string, string[]>()
    for (const s of fresh) {
      seen.add(s.record_id)
      byOrganization.set(s.organization_id, [...(byOrganization.get(s.organization_id) ?? []), s.record_id])
    }
    for (const [organizationId, records] of byOrganization) {
      await db.transaction(tx => refreshInsightFacts(tx, organizationId, records))
    }
    refreshed += fresh.length
  }
}
