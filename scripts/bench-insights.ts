// `npm run bench:insights`: builds a scratch database (sealwright_bench_insights on the private
// cluster) with about 143,000 fit tests and 10⁶ exercise rows of invented data, builds the insights
// summary with the rebuild the seed uses, then times every insights panel with the same SQL the
// routes run, alone and six at once as the page asks. Prints figures; asserts nothing.
// SEALWRIGHT_BENCH_TESTS changes the size (e.g. 20000 while iterating); SEALWRIGHT_BENCH_REUSE=1
// keeps an existing scratch database; SEALWRIGHT_BENCH_BEFORE=1 also times the same panels worked
// out from the raw rows, as they were before the summary (slow: tens of seconds at full size).
import { performance } from 'node:perf_hooks'
import { fileURLToPath } from 'node:url'
import { sql } from 'drizzle-orm'
import { drizzle } from 'drizzle-orm/node-postgres'
import pg from 'pg'
import { rebuildInsightFacts } from '../server/database/insight-facts'
import * as q from '../server/database/insight-queries'
import { insightRead } from '../server/database/insight-scope'
import * as raw from '../server/database/insight-raw'
import type { InsightFilters } from '../shared/utils/insight-schemas'
import { applyMigrations, ensureDatabase } from './lib/database.mjs'
import { ensureDatabaseServer } from './lib/services.mjs'

const projectDir = fileURLToPath(new URL('..', import.meta.url))
const TESTS = Number(process.env.SEALWRIGHT_BENCH_TESTS || 143_000)
const PEOPLE = Math.max(100, Math.round(TESTS / 7))
const reuse = process.env.SEALWRIGHT_BENCH_REUSE === '1'
const before = process.env.SEALWRIGHT_BENCH_BEFORE === '1'
const port = Number(process.env.SEALWRIGHT_PG_PORT || 54329)

const server = await ensureDatabaseServer(projectDir, { externalUrl: process.env.NUXT_BENCH_DATABASE_URL, port })
const url = await ensureDatabase(server.serverUrl, 'sealwright_bench_insights', { recreate: !reuse })
await applyMigrations(url)
const pool = new pg.Pool({ connectionString: url, max: 6 })
const db = drizzle(pool)
const step = async (label: string, query: ReturnType<typeof sql>) => {
  const started = performance.now()
  await db.execute(query)
  console.log(`  ${label}: ${((performance.now() - started) / 1000).toFixed(1)} s`)
}

const ORG = '00000000-0000-4000-8000-000000000001'
const existing = await db.execute(sql`select count(*)::int as n from fit_test_exercise_results`)
if (Number((existing.rows[0] as { n: number }).n) === 0) {
  console.log(`Building ${TESTS.toLocaleString('en')} tests for ${PEOPLE.toLocaleString('en')} people (invented data)…`)
  await step('organization, sites, users, models, counters, people', sql.raw(`
    select setseed(0.42);
    insert into organizations (id, name, slug) values ('${ORG}', 'Bench Works (invented)', 'bench-works');
    insert into sites (id, organization_id, name, time_zone)
      select md5('site' || i)::uuid, '${ORG}', 'Site ' || i, case when i % 2 = 0 then 'America/Chicago' else 'America/New_York' end from generate_series(1, 4) i;
    insert into users (id, organization_id, email, display_name, role, password_hash)
      select md5('tester' || i)::uuid, '${ORG}', 'tester' || i || '@bench.example', 'Tester ' || i, 'tester', 'x' from generate_series(1, 20) i;
    insert into respirator_models (id, organization_id, make, model, respirator_class, sizes)
      select md5('model' || i)::uuid, '${ORG}', 'Bench Make ' || (i % 3), 'BM-' || i, case when i <= 5 then 'elastomeric-half-mask' else 'elastomeric-full-facepiece' end, '["S","M","L"]'::jsonb from generate_series(1, 8) i;
    insert into counters (id, organization_id, site_id, serial_number, description, sample_flow_cm3_per_min)
      select md5('counter' || i)::uuid, '${ORG}', md5('site' || (1 + i % 4))::uuid, 'BC-' || i, 'Bench counter', 350 from generate_series(1, 10) i;
    insert into people (id, organization_id, site_id, full_name, medical_clearance_status)
      select md5('person' || i)::uuid, '${ORG}', md5('site' || (1 + i % 4))::uuid, 'Person ' || i, 'cleared' from generate_series(1, ${PEOPLE}) i;
  `))
  await step('exercise factors', sql.raw(`
    select setseed(0.43);
    create unlogged table bench_ex as
      select i, e.key, e.movement,
        exp(ln(900) + 0.9 * sin(i % ${PEOPLE}) + e.offset_ln + 0.5 * (random() + random() + random() - 1.5) * 2) as ff
      from generate_series(1, ${TESTS}) i
      cross join (values ('normal-breathing-start', 'normal-breathing', 0.0), ('deep-breathing', 'deep-breathing', -0.2), ('head-side-to-side', 'head-side-to-side', -0.3),
        ('head-up-and-down', 'head-up-and-down', -0.1), ('talking', 'talking', -0.5), ('bending-over', 'bending', -0.6), ('normal-breathing-end', 'normal-breathing', 0.0)) e(key, movement, offset_ln);
  `))
  await step('fit tests', sql.raw(`
    insert into fit_tests (id, organization_id, record_id, status, version, person_id, site_id, tester_user_id, counter_id, respirator_model_id,
      respirator_make, respirator_model, respirator_class, respirator_size, kind, protocol_key, performed_at, pre_test, entry,
      pass_level, overall_fit_factor, overall_is_lower_bound, passed, limiting_exercise_key, due_on, finished_at)
    select md5('test' || a.i)::uuid, '${ORG}', md5('record' || a.i)::uuid, 'finished', 2, md5('person' || (1 + a.i % ${PEOPLE}))::uuid,
      md5('site' || (1 + (a.i % ${PEOPLE}) % 4))::uuid, md5('tester' || (1 + a.i % 20))::uuid, md5('counter' || (1 + a.i % 10))::uuid, md5('model' || m)::uuid,
      'Bench Make ' || (m % 3), 'BM-' || m, case when m <= 5 then 'elastomeric-half-mask' else 'elastomeric-full-facepiece' end, (array['S','M','L'])[1 + a.i % 3],
      'quantitative', 'osha-standard', at, '{}'::jsonb, '{}'::jsonb,
      case when m <= 5 then 100 else 500 end, overall, false, overall >= case when m <= 5 then 100 else 500 end, limiting,
      case when overall >= case when m <= 5 then 100 else 500 end then (at + interval '1 year')::date end, at + interval '9 minutes'
    from (
      select i, 7 / sum(1 / ff) as overall, (array_agg(key order by ff))[1] as limiting, 1 + ((i % ${PEOPLE}) % 8) as m,
        now() - interval '3 years' + ((i / ${PEOPLE}::float) * interval '3 years') + (i % 97) * interval '1 hour' as at
      from bench_ex group by i
    ) a;
  `))
  await step('exercise rows', sql.raw(`
    insert into fit_test_exercise_results (fit_test_id, organization_id, exercise_key, movement, fit_factor, is_lower_bound, penetration_share, is_limiting)
    select md5('test' || i)::uuid, '${ORG}', key, movement, ff, false, (1 / ff) / sum(1 / ff) over (partition by i), row_number() over (partition by i order by ff) = 1
    from bench_ex;
    drop table bench_ex;
  `))
  await step('readiness checks (one a day per counter, one day in 30 failed)', sql.raw(`
    insert into readiness_checks (organization_id, template_name, counter_id, site_id, steps, status, started_at, completed_at)
    select '${ORG}', 'Bench check', md5('counter' || c)::uuid, md5('site' || (1 + c % 4))::uuid, '[]'::jsonb,
      case when d % 30 = 0 then 'failed' else 'passed' end, day + interval '6 hours', day + interval '6 hours 10 minutes'
    from generate_series(1, 10) c, generate_series(0, 1100) d, lateral (select date_trunc('day', now() - interval '3 years') + d * interval '1 day' as day) x;
  `))
  await step('analyze', sql`analyze`)
}
const summarized = Number((await db.execute(sql`select count(*)::int as n from insight_results`)).rows.map(r => (r as { n: number }).n)[0])
// A reused database summarized before a migration that added summary columns: build it afresh.
const unfilled = Number((await db.execute(sql`select count(*)::int as n from insight_results where share_talking is null and other_shares is null`)).rows.map(r => (r as { n: number }).n)[0])
if (summarized === 0 || unfilled > 0) {
  const started = performance.now()
  const n = await rebuildInsightFacts(db)
  await db.execute(sql`analyze insight_results; analyze insight_drift`)
  console.log(`  insights summary rebuilt from the raw rows (${n.toLocaleString('en')} results): ${((performance.now() - started) / 1000).toFixed(1)} s`)
}
const counts = (await db.execute(sql`select (select count(*) from fit_tests)::int as tests, (select count(*) from fit_test_exercise_results)::int as exercises`)).rows[0] as { tests: number, exercises: number }
console.log(`Scratch database: ${counts.tests.toLocaleString('en')} fit tests, ${counts.exercises.toLocaleString('en')} exercise rows.`)

const modelId = (await db.execute(sql`select md5('model3')::uuid::text as id`)).rows.map(r => (r as { id: string }).id)[0]!
const siteId = (await db.execute(sql`select md5('site2')::uuid::text as id`)).rows.map(r => (r as { id: string }).id)[0]!
const lastYear = new Date(Date.now() - 365 * 86400_000).toISOString().slice(0, 10)
const cases: [string, InsightFilters][] = [
  ['all results', { bucket: 'month' }],
  ['one model', { bucket: 'month', respiratorModelId: modelId }],
  ['one site, last 12 months', { bucket: 'month', siteId, from: lastYear }]
]
type Panels = typeof q | typeof raw
// The summary panels run as the routes run them: each in its own read transaction (insightRead).
const read = (m: Panels) => <T>(run: (runner: typeof db) => Promise<T>) => (m === q ? insightRead(db, tx => run(tx as typeof db)) : run(db))
const panelsOf = (m: Panels): [string, (f: InsightFilters) => Promise<unknown>][] => [
  ['pass rates', f => read(m)(r => m.passRatesByPeriod(r, ORG, f))],
  ['models and sizes', f => read(m)(r => m.modelSummaries(r, ORG, f))],
  ['exercises', f => read(m)(r => m.exerciseSummaries(r, ORG, f))],
  ['drift', f => read(m)(r => m.driftingPeople(r, ORG, f))],
  ['testers', f => read(m)(r => m.testerSummaries(r, ORG, f))],
  ['coverage', f => read(m)(r => m.coverageSummaries(r, ORG, f))]
]
async function timed(run: () => Promise<unknown>, rounds: number) {
  await run()
  const samples: number[] = []
  for (let i = 0; i < rounds; i++) {
    const started = performance.now()
    await run()
    samples.push(performance.now() - started)
  }
  return samples.sort((a, b) => a - b)[Math.floor(samples.length / 2)]!
}
const sources: [string, Panels, number][] = [['from the summary', q, 5], ...(before ? [['from the raw rows (before)', raw, 1] as [string, Panels, number]] : [])]
for (const [source, module, rounds] of sources) {
  for (const [label, f] of cases) {
    console.log(`\nPanels ${source}, ${label} (median of ${rounds} after a warm-up, ms; target < 300 each):`)
    const panels = panelsOf(module)
    for (const [name, run] of panels) console.log(`  ${name.padEnd(18)} ${(await timed(() => run(f), rounds)).toFixed(0).padStart(6)}`)
    const page = await timed(() => Promise.all(panels.map(([, run]) => run(f))), rounds)
    console.log(`  ${'whole page'.padEnd(18)} ${page.toFixed(0).padStart(6)}  (six panels at once, as the page asks; target < 1000)`)
  }
}
const load = (await import('node:os')).loadavg()[0]!
console.log(`\nLoad average while measuring: ${load.toFixed(1)} on ${(await import('node:os')).cpus().length} cores (others' work shares them).`)
await pool.end()
server.stop()
