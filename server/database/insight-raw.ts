import { sql } from 'drizzle-orm'
import type { InsightFilters } from '../../shared/utils/insight-schemas'
import { DRIFT_DROP_FRACTION, DRIFT_MIN_TESTS } from '../../shared/utils/insight-schemas'
import { driftPersonOf, insightScope, int, num, rows } from './insight-scope'
import type { SqlRunner } from './insight-scope'

// The insights panels worked out straight from the raw rows (fit_tests, fit_test_exercise_results,
// readiness_checks), as they were before the summary tables. The routes read the summary
// (insight-queries.ts); these stay as the reference the consistency test compares the summary
// with, and as the benchmark's "before" figures. Too slow for the page at a real program's size.

/** Pass rates by month or quarter (site time): all attempts and first attempts. */
export async function passRatesByPeriod(db: SqlRunner, organizationId: string, f: InsightFilters) {
  const unit = f.bucket === 'quarter' ? sql.raw(`'quarter'`) : sql.raw(`'month'`)
  const r = await rows<Record<string, unknown>>(db, sql`
    with s as (
      select ft.performed_at, ft.passed, st.time_zone,
        row_number() over (partition by ft.person_id, ft.respirator_model_id order by ft.performed_at, ft.id) = 1 as first_attempt
      from fit_tests ft join sites st on st.id = ft.site_id
      where ${insightScope(organizationId, f)}
    )
    select to_char(date_trunc(${unit}, performed_at at time zone time_zone), 'YYYY-MM-DD') as period,
      count(*) as tests, count(*) filter (where passed) as passed,
      count(*) filter (where first_attempt) as first_tests, count(*) filter (where first_attempt and passed) as first_passed
    from s group by 1 order by 1`)
  return r.map(x => ({ period: String(x.period), tests: int(x.tests), passed: int(x.passed), firstTests: int(x.first_tests), firstPassed: int(x.first_passed) }))
}

/** Respirator models and sizes: first-attempt pass rate and the spread of ln(overall FF). */
export async function modelSummaries(db: SqlRunner, organizationId: string, f: InsightFilters) {
  const r = await rows<Record<string, unknown>>(db, sql`
    with s as (
      select ft.respirator_model_id, ft.respirator_make, ft.respirator_model, ft.respirator_size, ft.passed,
        ft.overall_is_lower_bound,
        case when ft.overall_fit_factor > 0 then ln(ft.overall_fit_factor) end as ln_ff,
        row_number() over (partition by ft.person_id, ft.respirator_model_id order by ft.performed_at, ft.id) = 1 as first_attempt
      from fit_tests ft where ${insightScope(organizationId, f)}
    )
    select respirator_model_id, respirator_make, respirator_model, respirator_size,
      count(*) as tests, count(*) filter (where passed) as passed,
      count(*) filter (where first_attempt) as first_tests, count(*) filter (where first_attempt and passed) as first_passed,
      count(ln_ff) as quantitative, count(*) filter (where overall_is_lower_bound) as lower_bounds,
      exp(avg(ln_ff)) as gm, exp(stddev_samp(ln_ff)) as gsd, exp(min(ln_ff)) as min_ff, exp(max(ln_ff)) as max_ff,
      percentile_cont(array[0.05, 0.25, 0.5, 0.75, 0.95]) within group (order by ln_ff) as ln_quantiles
    from s group by 1, 2, 3, 4 order by 2, 3, 4`)
  return r.map(x => ({
    respiratorModelId: String(x.respirator_model_id),
    make: String(x.respirator_make),
    model: String(x.respirator_model),
    size: String(x.respirator_size),
    tests: int(x.tests),
    passed: int(x.passed),
    firstTests: int(x.first_tests),
    firstPassed: int(x.first_passed),
    quantitative: int(x.quantitative),
    lowerBounds: int(x.lower_bounds),
    geometricMean: num(x.gm),
    geometricStandardDeviation: num(x.gsd),
    min: num(x.min_ff),
    max: num(x.max_ff),
    /** p5, p25, median, p75, p95 of the overall fit factor (percentile_cont on ln FF, back-transformed). */
    quantiles: Array.isArray(x.ln_quantiles) && x.ln_quantiles[0] !== null ? (x.ln_quantiles as number[]).map(v => Math.exp(Number(v))) : null
  }))
}

/**
 * Which exercise breaks the seal: per protocol (and per protocol and model), how often each
 * movement is the limiting one and its mean share of the penetration. Exercises of one movement
 * within a test (normal breathing at start and end) add their shares.
 */
export async function exerciseSummaries(db: SqlRunner, organizationId: string, f: InsightFilters) {
  const r = await rows<Record<string, unknown>>(db, sql`
    with per_test as (
      select ft.protocol_key, ft.respirator_model_id, ft.respirator_make, ft.respirator_model, e.movement,
        sum(e.penetration_share) as share, bool_or(e.is_limiting) as limiting
      from fit_test_exercise_results e join fit_tests ft on ft.id = e.fit_test_id
      where e.organization_id = ${organizationId} and ${insightScope(organizationId, f)}
      group by e.fit_test_id, ft.protocol_key, ft.respirator_model_id, ft.respirator_make, ft.respirator_model, e.movement
    )
    select protocol_key, respirator_model_id, respirator_make, respirator_model, movement,
      count(*) as tests, count(*) filter (where limiting) as limiting, avg(share) as mean_share,
      grouping(respirator_model_id) as all_models
    from per_test
    group by grouping sets ((protocol_key, movement), (protocol_key, respirator_model_id, respirator_make, respirator_model, movement))
    order by protocol_key, all_models desc, respirator_make, respirator_model, movement`)
  return r.map(x => ({
    protocolKey: String(x.protocol_key),
    respiratorModelId: x.all_models === 1 || x.all_models === '1' ? null : String(x.respirator_model_id),
    make: x.respirator_make === null ? null : String(x.respirator_make),
    model: x.respirator_model === null ? null : String(x.respirator_model),
    movement: String(x.movement),
    tests: int(x.tests),
    limiting: int(x.limiting),
    meanShare: Number(x.mean_share)
  }))
}

/**
 * Whose fit is drifting: for each person with three or more tests on one model, the Theil–Sen
 * slope of ln(overall FF) against time in years (Sen 1968) — the median of pairwise slopes,
 * computed in SQL — and the flags of assessDrift (shared/utils/compute/insight-stats.ts).
 */
export async function driftingPeople(db: SqlRunner, organizationId: string, f: InsightFilters, limit = 100) {
  const r = await rows<Record<string, unknown>>(db, sql`
    with pts as (
      select ft.person_id, ft.respirator_model_id, ft.id, ft.performed_at, ft.due_on, ft.pass_level,
        extract(epoch from ft.performed_at) / 31557600.0 as t, ln(ft.overall_fit_factor) as y,
        count(*) over (partition by ft.person_id, ft.respirator_model_id) as n,
        row_number() over (partition by ft.person_id, ft.respirator_model_id order by ft.performed_at desc, ft.id desc) as latest_rank
      from fit_tests ft
      where ${insightScope(organizationId, f)} and ft.overall_fit_factor > 0
    ),
    groups as (select * from pts where n >= ${DRIFT_MIN_TESTS}),
    slopes as (
      select a.person_id, a.respirator_model_id, percentile_cont(0.5) within group (order by (b.y - a.y) / (b.t - a.t)) as slope
      from groups a join groups b on b.person_id = a.person_id and b.respirator_model_id = a.respirator_model_id and b.t > a.t
      group by 1, 2
    ),
    fits as (
      select g.person_id, g.respirator_model_id, s.slope,
        percentile_cont(0.5) within group (order by g.y - s.slope * g.t) as intercept,
        percentile_cont(0.5) within group (order by g.y) as median_y,
        count(*) as tests,
        array_agg(exp(g.y) order by g.t) as series,
        array_agg(to_char(g.performed_at at time zone 'UTC', 'YYYY-MM-DD') order by g.t) as dates
      from groups g join slopes s using (person_id, respirator_model_id)
      group by 1, 2, 3
    ),
    judged as (
      select fits.*, l.y as latest_y, l.pass_level, l.id as latest_id,
        extract(epoch from coalesce(l.due_on::timestamp at time zone 'UTC', l.performed_at)) / 31557600.0 as due_t,
        coalesce(l.due_on, (l.performed_at at time zone 'UTC')::date) as next_due_on
      from fits join groups l on l.person_id = fits.person_id and l.respirator_model_id = fits.respirator_model_id and l.latest_rank = 1
    ),
    flagged as (
      select judged.*, exp(intercept + slope * due_t) as predicted_at_due,
        exp(latest_y) < ${DRIFT_DROP_FRACTION} * exp(median_y) as below_median,
        (slope < 0 and exp(intercept + slope * due_t) < pass_level) as predicts_fail
      from judged
    )
    select flagged.*, p.full_name, p.employee_number, ft.respirator_make, ft.respirator_model, ft.respirator_size,
      count(*) over () as candidates
    from flagged
    join people p on p.id = flagged.person_id
    join fit_tests ft on ft.id = flagged.latest_id
    where below_median or predicts_fail
    order by slope asc
    limit ${limit}`)
  const [candidates] = await rows<{ n: unknown }>(db, sql`
    select count(*) as n from (select 1 from fit_tests ft where ${insightScope(organizationId, f)} and ft.overall_fit_factor > 0
      group by ft.person_id, ft.respirator_model_id having count(*) >= ${DRIFT_MIN_TESTS}) g`)
  return {
    candidates: int(candidates?.n),
    people: r.map(driftPersonOf)
  }
}

/** Each tester's results, and the organization's rate over the same filters (tester filter aside). */
export async function testerSummaries(db: SqlRunner, organizationId: string, f: InsightFilters) {
  const r = await rows<Record<string, unknown>>(db, sql`
    select ft.tester_user_id, u.display_name, count(*) as tests, count(*) filter (where ft.passed) as passed
    from fit_tests ft join users u on u.id = ft.tester_user_id
    where ${insightScope(organizationId, f, { ignoreTester: true })}
    group by 1, 2 order by 2`)
  return r.map(x => ({ testerUserId: String(x.tester_user_id), testerName: String(x.display_name), tests: int(x.tests), passed: int(x.passed) }))
}

/**
 * Share of results covered by a readiness check, by counter and month. The same rule as
 * shared/utils/coverage.ts decideCoverage for fit tests: the last check of the same counter that
 * ended (passed or failed) at or before the result, on the same calendar day in the result's site
 * time zone, must have passed; and the counter's calibration must not be past due that day.
 * One ordered pass over checks and results per counter (window functions), not a lookup per row.
 */
export async function coverageSummaries(db: SqlRunner, organizationId: string, f: InsightFilters) {
  const r = await rows<Record<string, unknown>>(db, sql`
    with results as (
      select ft.id, ft.counter_id, ft.performed_at, st.time_zone
      from fit_tests ft join sites st on st.id = ft.site_id
      where ${insightScope(organizationId, f)} and ft.counter_id is not null
    ),
    events as (
      select rc.counter_id, rc.completed_at as at, 0 as kind, rc.status, null::uuid as result_id, null::text as time_zone
      from readiness_checks rc
      where rc.organization_id = ${organizationId} and rc.status in ('passed', 'failed') and rc.completed_at is not null
        and rc.counter_id in (select distinct counter_id from results)
      union all
      select counter_id, performed_at, 1, null, id, time_zone from results
    ),
    numbered as (
      select *, count(*) filter (where kind = 0) over (partition by counter_id order by at, kind rows unbounded preceding) as grp
      from events
    ),
    marked as (
      select *, first_value(status) over w as last_status, first_value(at) over w as last_at
      from numbered window w as (partition by counter_id, grp order by kind, at)
    )
    select c.id as counter_id, c.serial_number,
      to_char(date_trunc('month', m.at at time zone m.time_zone), 'YYYY-MM-DD') as period,
      count(*) as tests,
      count(*) filter (where m.last_status = 'passed'
        and (m.last_at at time zone m.time_zone)::date = (m.at at time zone m.time_zone)::date
        and (c.calibration_due_on is null or (m.at at time zone m.time_zone)::date <= c.calibration_due_on)) as covered
    from marked m join counters c on c.id = m.counter_id
    where m.kind = 1
    group by 1, 2, 3 order by 2, 3`)
  const [noCounter] = await rows<{ n: unknown }>(db, sql`select count(*) as n from fit_tests ft where ${insightScope(organizationId, f)} and ft.counter_id is null`)
  return {
    withoutCounter: int(noCounter?.n),
    rows: r.map(x => ({ counterId: String(x.counter_id), counterSerial: String(x.serial_number), period: String(x.period), tests: int(x.tests), covered: int(x.covered) }))
  }
}
