import { sql } from 'drizzle-orm'
import { CANONICAL_MOVEMENTS } from '../../shared/utils/compute/movements'
import type { InsightFilters } from '../../shared/utils/insight-schemas'
import { factScope, firstAttemptOf, int, localDays, num, rows, shareColumn } from './insight-scope'
import type { SqlRunner } from './insight-scope'

export { driftingPeople } from './insight-drift'

// The insights panels, each one query over the summary of current finished results
// (insight_results, kept by insight-facts.ts), grouped in PostgreSQL so the server never loads
// every test. insight-raw.ts works the same numbers out from the raw rows; a test holds them equal.

/** Pass rates by month or quarter (site time): all attempts and first attempts. */
export async function passRatesByPeriod(db: SqlRunner, organizationId: string, f: InsightFilters) {
  const unit = f.bucket === 'quarter' ? sql.raw(`'quarter'`) : sql.raw(`'month'`)
  const local = await localDays(db, organizationId)
  const r = await rows<Record<string, unknown>>(db, sql`
    with s as (
      select date_trunc(${unit}, ${local.day}::timestamp) as period, f.passed, ${firstAttemptOf(f)} as first_attempt
      from insight_results f ${local.sites}
      where ${factScope(organizationId, f)}
    )
    select to_char(period, 'YYYY-MM-DD') as period, tests, passed, first_tests, first_passed from (
      select period, count(*) as tests, count(*) filter (where passed) as passed,
        count(*) filter (where first_attempt) as first_tests, count(*) filter (where first_attempt and passed) as first_passed
      from s group by 1
    ) g order by g.period`)
  return r.map(x => ({ period: String(x.period), tests: int(x.tests), passed: int(x.passed), firstTests: int(x.first_tests), firstPassed: int(x.first_passed) }))
}

/** Respirator models and sizes: first-attempt pass rate and the spread of ln(overall FF). */
export async function modelSummaries(db: SqlRunner, organizationId: string, f: InsightFilters) {
  const r = await rows<Record<string, unknown>>(db, sql`
    with s as (
      select f.respirator_model_id, f.respirator_make collate "C" as make, f.respirator_model collate "C" as model, f.respirator_size collate "C" as size,
        f.passed, f.overall_is_lower_bound, f.ln_fit_factor as ln_ff, ${firstAttemptOf(f)} as first_attempt
      from insight_results f where ${factScope(organizationId, f)}
    )
    -- Grouped by bytes (collate "C": the same groups, a cheaper sort), shown in the usual order.
    select * from (
    select respirator_model_id, make as respirator_make, model as respirator_model, size as respirator_size,
      count(*) as tests, count(*) filter (where passed) as passed,
      count(*) filter (where first_attempt) as first_tests, count(*) filter (where first_attempt and passed) as first_passed,
      count(ln_ff) as quantitative, count(*) filter (where overall_is_lower_bound) as lower_bounds,
      exp(avg(ln_ff)) as gm, exp(stddev_samp(ln_ff)) as gsd, exp(min(ln_ff)) as min_ff, exp(max(ln_ff)) as max_ff,
      percentile_cont(array[0.05, 0.25, 0.5, 0.75, 0.95]) within group (order by ln_ff) as ln_quantiles
    from s group by respirator_model_id, size, make, model
    ) g order by g.respirator_make collate "default", g.respirator_model collate "default", g.respirator_size collate "default"`)
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

// Per movement: tests that include it and the sum of its shares of the penetration.
const canonicalColumns = sql.raw(CANONICAL_MOVEMENTS.map((m, i) =>
  `count(f.${shareColumn(m)}) as t${i}, sum(f.${shareColumn(m)}) as s${i}`).join(',\n      '))

interface ExerciseRow { protocolKey: string, respiratorModelId: string | null, make: string | null, model: string | null, movement: string, tests: number, limiting: number, meanShare: number }

/**
 * Which exercise breaks the seal: per protocol (and per protocol and model), how often each
 * movement is the limiting one and its mean share of the penetration. Exercises of one movement
 * within a test (normal breathing at start and end) add their shares. One pass over the results
 * groups by protocol, model and limiting movement, the canonical movements as columns (custom
 * protocols' movements from their map); the per-model and all-models rows are those groups added up.
 */
export async function exerciseSummaries(db: SqlRunner, organizationId: string, f: InsightFilters): Promise<ExerciseRow[]> {
  const canonical = await rows<Record<string, unknown>>(db, sql`
    select f.protocol_key, f.respirator_model_id, f.respirator_make, f.respirator_model, f.limiting_movement, count(*) as n, ${canonicalColumns}
    from insight_results f
    where ${factScope(organizationId, f)}
    group by 1, 2, 3, 4, 5`)
  const custom = await rows<Record<string, unknown>>(db, sql`
    select f.protocol_key, f.respirator_model_id, f.respirator_make, f.respirator_model, o.key as movement,
      count(*) as tests, count(*) filter (where f.limiting_movement = o.key) as limiting, sum(o.value::float8) as share_sum
    from insight_results f cross join lateral jsonb_each_text(f.other_shares) o
    where ${factScope(organizationId, f)} and f.other_shares is not null
    group by 1, 2, 3, 4, 5`)
  type Group = { x: Record<string, unknown>, movement: string, tests: number, limiting: number, shareSum: number }
  const byModel = new Map<string, Group>()
  const add = (g: Group) => {
    const key = [g.x.protocol_key, g.x.respirator_model_id, g.x.respirator_make, g.x.respirator_model, g.movement].map(String).join('\u0000')
    const sum = byModel.get(key)
    byModel.set(key, sum ? { ...sum, tests: sum.tests + g.tests, limiting: sum.limiting + g.limiting, shareSum: sum.shareSum + g.shareSum } : g)
  }
  for (const x of canonical) {
    CANONICAL_MOVEMENTS.forEach((movement, i) => add({ x, movement, tests: int(x[`t${i}`]), limiting: x.limiting_movement === movement ? int(x.n) : 0, shareSum: Number(x[`s${i}`] ?? 0) }))
  }
  for (const x of custom) add({ x, movement: String(x.movement), tests: int(x.tests), limiting: int(x.limiting), shareSum: Number(x.share_sum) })
  const perModel = [...byModel.values()].filter(g => g.tests > 0)
  const all = new Map<string, { protocolKey: string, movement: string, tests: number, limiting: number, shareSum: number }>()
  for (const g of perModel) {
    const key = `${String(g.x.protocol_key)}\u0000${g.movement}`
    const sum = all.get(key) ?? { protocolKey: String(g.x.protocol_key), movement: g.movement, tests: 0, limiting: 0, shareSum: 0 }
    all.set(key, { ...sum, tests: sum.tests + g.tests, limiting: sum.limiting + g.limiting, shareSum: sum.shareSum + g.shareSum })
  }
  const out: ExerciseRow[] = [
    ...[...all.values()].map(a => ({ protocolKey: a.protocolKey, respiratorModelId: null, make: null, model: null, movement: a.movement, tests: a.tests, limiting: a.limiting, meanShare: a.shareSum / a.tests })),
    ...perModel.map(g => ({
      protocolKey: String(g.x.protocol_key), respiratorModelId: String(g.x.respirator_model_id), make: String(g.x.respirator_make), model: String(g.x.respirator_model),
      movement: g.movement, tests: g.tests, limiting: g.limiting, meanShare: g.shareSum / g.tests
    }))
  ]
  const cmp = (a: string | null, b: string | null) => ((a ?? '') < (b ?? '') ? -1 : (a ?? '') > (b ?? '') ? 1 : 0)
  // As before: by protocol, the all-models rows first, then by make, model and movement.
  return out.sort((a, b) => cmp(a.protocolKey, b.protocolKey) || Number(a.respiratorModelId !== null) - Number(b.respiratorModelId !== null)
    || cmp(a.make, b.make) || cmp(a.model, b.model) || cmp(a.movement, b.movement))
}

/** Each tester's results, and the organization's rate over the same filters (tester filter aside). */
export async function testerSummaries(db: SqlRunner, organizationId: string, f: InsightFilters) {
  const r = await rows<Record<string, unknown>>(db, sql`
    select f.tester_user_id, u.display_name, count(*) as tests, count(*) filter (where f.passed) as passed
    from insight_results f join users u on u.id = f.tester_user_id
    where ${factScope(organizationId, f, { ignoreTester: true })}
    group by 1, 2 order by 2`)
  return r.map(x => ({ testerUserId: String(x.tester_user_id), testerName: String(x.display_name), tests: int(x.tests), passed: int(x.passed) }))
}

/**
 * Share of results covered by a readiness check, by counter and month: the last check of the
 * same counter that ended at or before the result (kept in the summary) passed on the same
 * calendar day in the result's site time zone, and the counter's calibration was not past due
 * that day — the rule of shared/utils/coverage.ts decideCoverage.
 */
export async function coverageSummaries(db: SqlRunner, organizationId: string, f: InsightFilters) {
  // One pass: results without a counter form the group whose counter_id is null.
  const local = await localDays(db, organizationId)
  const r = await rows<Record<string, unknown>>(db, sql`
    with s as (
      select f.counter_id, f.last_check_passed, ${local.checkDay} as check_day, ${local.day} as day
      from insight_results f ${local.sites}
      where ${factScope(organizationId, f)}
    ),
    g as (
      select s.counter_id, date_trunc('month', s.day::timestamp) as period, count(*) as tests,
        count(*) filter (where s.last_check_passed and s.check_day = s.day and (c.calibration_due_on is null or s.day <= c.calibration_due_on)) as covered
      from s left join counters c on c.id = s.counter_id
      where s.counter_id is null or c.id is not null
      group by 1, 2
    )
    select g.counter_id, c.serial_number, to_char(g.period, 'YYYY-MM-DD') as period, g.tests, g.covered
    from g left join counters c on c.id = g.counter_id
    order by c.serial_number, g.period`)
  const withCounter = r.filter(x => x.counter_id !== null)
  return {
    withoutCounter: r.filter(x => x.counter_id === null).reduce((n, x) => n + int(x.tests), 0),
    rows: withCounter.map(x => ({ counterId: String(x.counter_id), counterSerial: String(x.serial_number), period: String(x.period), tests: int(x.tests), covered: int(x.covered) }))
  }
}
