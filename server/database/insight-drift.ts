import { sql } from 'drizzle-orm'
import type { SQL } from 'drizzle-orm'
import type { InsightFilters } from '../../shared/utils/insight-schemas'
import { DRIFT_DROP_FRACTION, DRIFT_MIN_TESTS } from '../../shared/utils/insight-schemas'
import { driftPersonOf, factScope, int, keepsWholeSeries, rows } from './insight-scope'
import type { SqlRunner } from './insight-scope'

/** The fit factors (from ln FF `y`) and dates of a series, in time `t` order, as columns `series` and `dates`. */
const seriesColumns = (alias: string, y: string, t: string) => sql.raw(
  `array_agg(exp(${alias}.${y}) order by ${t}) as series, array_agg(to_char(${alias}.performed_at at time zone 'UTC', 'YYYY-MM-DD') order by ${t}) as dates`)

/**
 * Whose fit is drifting, over the summary rows `insight_results f` that `scope` selects: for each
 * person with three or more results on one model, the Theil–Sen slope of ln(overall FF) against
 * time in years (Sen 1968) — the median of pairwise slopes — and the flags of assessDrift
 * (shared/utils/compute/insight-stats.ts). One row per person and model, flagged or not. With
 * `withSeries` false the fit factors and dates of each series are left out (driftingPeople adds them to
 * the few rows a panel shows), which spares two ordered aggregates per series.
 */
export function driftFits(scope: SQL, withSeries = true): SQL {
  return sql`
    with pts as (
      select f.organization_id, f.person_id, f.respirator_model_id, f.fit_test_id as id, f.performed_at, f.due_on, f.pass_level,
        extract(epoch from f.performed_at) / 31557600.0 as t, f.ln_fit_factor as y,
        count(*) over (partition by f.person_id, f.respirator_model_id) as n,
        row_number() over (partition by f.person_id, f.respirator_model_id order by f.performed_at desc, f.fit_test_id desc) as latest_rank
      from insight_results f
      where ${scope} and f.ln_fit_factor is not null
    ),
    groups as (select * from pts where n >= ${DRIFT_MIN_TESTS}),
    slopes as (
      select a.person_id, a.respirator_model_id, percentile_cont(0.5) within group (order by (b.y - a.y) / (b.t - a.t)) as slope
      from groups a join groups b on b.person_id = a.person_id and b.respirator_model_id = a.respirator_model_id and b.t > a.t
      group by 1, 2
    ),
    fits as (
      select g.organization_id, g.person_id, g.respirator_model_id, s.slope,
        percentile_cont(0.5) within group (order by g.y - s.slope * g.t) as intercept,
        percentile_cont(0.5) within group (order by g.y) as median_y,
        count(*) as tests${withSeries ? sql`, ${seriesColumns('g', 'y', 'g.t')}` : sql``}
      from groups g join slopes s using (person_id, respirator_model_id)
      group by 1, 2, 3, 4
    ),
    judged as (
      select fits.*, l.y as latest_y, l.pass_level, l.id as latest_id,
        extract(epoch from coalesce(l.due_on::timestamp at time zone 'UTC', l.performed_at)) / 31557600.0 as due_t,
        coalesce(l.due_on, (l.performed_at at time zone 'UTC')::date) as next_due_on
      from fits join groups l on l.person_id = fits.person_id and l.respirator_model_id = fits.respirator_model_id and l.latest_rank = 1
    )
    select judged.*, exp(intercept + slope * due_t) as predicted_at_due,
      exp(latest_y) < ${DRIFT_DROP_FRACTION} * exp(median_y) as below_median,
      (slope < 0 and exp(intercept + slope * due_t) < pass_level) as predicts_fail
    from judged`
}

/** Fits for every series of the summary rows `series` selects, stored in insight_drift. */
export function storeDriftSql(series: SQL): SQL {
  return sql`
    insert into insight_drift (organization_id, person_id, respirator_model_id, latest_fit_test_id, tests, slope_per_year,
      latest_ln_fit_factor, median_ln_fit_factor, predicted_at_due, next_due_on, pass_level, below_median, predicts_fail, series, dates)
    select organization_id, person_id, respirator_model_id, latest_id, tests, slope, latest_y, median_y, predicted_at_due, next_due_on,
      pass_level, below_median, predicts_fail, series, dates
    from (${driftFits(series)}) d`
}

/**
 * The drift panel: people whose fit is flagged, steepest fall first, and how many series were
 * judged. Unfiltered or filtered by model only, it reads the stored fits; any other filter
 * changes the points of a series, so the fits are worked out from the filtered summary rows.
 */
export async function driftingPeople(db: SqlRunner, organizationId: string, f: InsightFilters, limit = 100) {
  let r: Record<string, unknown>[]
  let candidates: number
  const show = sql`p.full_name, p.employee_number, ft.respirator_make, ft.respirator_model, ft.respirator_size`
  if (keepsWholeSeries(f) && !f.to) {
    // The stored fits: the flagged ones through their partial index, and a count of all.
    const model = f.respiratorModelId ? sql`and d.respirator_model_id = ${f.respiratorModelId}` : sql``
    r = await rows<Record<string, unknown>>(db, sql`
      select d.person_id, d.respirator_model_id, d.tests, d.slope_per_year as slope, d.latest_ln_fit_factor as latest_y,
        d.median_ln_fit_factor as median_y, d.predicted_at_due, d.next_due_on, d.pass_level, d.below_median, d.predicts_fail, d.series, d.dates, ${show}
      from insight_drift d
      join people p on p.id = d.person_id
      join fit_tests ft on ft.id = d.latest_fit_test_id
      where d.organization_id = ${organizationId} ${model} and (d.below_median or d.predicts_fail)
      order by d.slope_per_year asc, d.person_id
      limit ${limit}`)
    candidates = int((await rows<{ n: unknown }>(db, sql`select count(*) as n from insight_drift d where d.organization_id = ${organizationId} ${model}`))[0]?.n)
  } else {
    // The flagged fits first; then each shown row's series, through the person-and-model index.
    r = await rows<Record<string, unknown>>(db, sql`
      with d as (${driftFits(factScope(organizationId, f), false)}),
      shown as (
        select d.*, (select count(*) from d) as candidates from d
        where d.below_median or d.predicts_fail
        order by d.slope asc, d.person_id
        limit ${limit}
      )
      select shown.*, s.series, s.dates, ${show}
      from shown
      join people p on p.id = shown.person_id
      join fit_tests ft on ft.id = shown.latest_id
      cross join lateral (
        select ${seriesColumns('f', 'ln_fit_factor', 'extract(epoch from f.performed_at) / 31557600.0')}
        from insight_results f
        where ${factScope(organizationId, f)} and f.ln_fit_factor is not null
          and f.person_id = shown.person_id and f.respirator_model_id = shown.respirator_model_id
      ) s
      order by shown.slope asc, shown.person_id`)
    candidates = int(r[0]?.candidates)
    if (r.length === 0) candidates = int((await rows<{ n: unknown }>(db, sql`with d as (${driftFits(factScope(organizationId, f), false)}) select count(*) as n from d`))[0]?.n)
  }
  return {
    candidates,
    people: r.map(driftPersonOf)
  }
}
