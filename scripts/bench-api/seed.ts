// A large invented program for `npm run bench:api`: 2,000+ people and 20,000+ finished tests, one in
// twenty from a 1 Hz count series. Rows are built from a handful of templates whose stored fields
// and stored result come from the shared computation (as the finish route stores them), then multiplied in PostgreSQL (set-based inserts), so seeding
// takes seconds. Everything here is invented.
import type pg from 'pg'
import { findBuiltInProtocol, protocolTimeline } from '../../shared/utils/compute'
import type { Protocol } from '../../shared/utils/compute'
import { storedFieldsOf } from '../../shared/utils/fit-test-evaluate'
import type { FitTestEntry } from '../../shared/utils/fit-test-schemas'
import { hashPassword } from '../seed/hash'

export const ORG = '00000000-0000-4000-8000-0000000000b1'
export const BENCH_EMAIL = 'bench.tester@bench.example'
export const BENCH_PASSWORD = 'bench-api-password'

/** A 1 Hz series (our long layout): ambient phases read `ambient`, in-mask phases ambient / FF. */
function series(protocol: Protocol, ambient: number, fitFactor: number) {
  const lines = ['t,channel,conc']
  const timeline = protocolTimeline(protocol)
  for (let t = 0; t < timeline.durationSeconds; t++) {
    const phase = timeline.exercises.flatMap(e => e.phases).find(p => t >= p.startSeconds && t < p.endSeconds)
    if (phase?.kind === 'ambient') lines.push(`${t},ambient,${ambient}`)
    else if (phase?.kind === 'mask') lines.push(`${t},mask,${(ambient / fitFactor).toFixed(3)}`)
    else lines.push(`${t},mask,${(ambient / 3).toFixed(1)}`)
  }
  return `${lines.join('\n')}\n`
}

function gridEntry(protocol: Protocol, fitFactors: number[]): FitTestEntry {
  let i = 0
  return {
    mode: 'grid',
    exercises: protocol.exercises.filter(e => e.counted).map((e) => {
      const ff = fitFactors[i++ % fitFactors.length]!
      return { exerciseKey: e.key, ambientBefore: 8000, ambientAfter: 8200, ambientMean: null, inMask: Number((8100 / ff).toFixed(3)), inMaskCount: null }
    })
  } as FitTestEntry
}

type Template = { entry: FitTestEntry, seriesText: string | null } & Pick<ReturnType<typeof storedFieldsOf>, 'stored' | 'evaluation'>

function templates(protocol: Protocol): Template[] {
  const out: Template[] = []
  const spreads = [[900, 1400, 2100, 700, 1800], [150, 300, 90, 400, 220], [2500, 3000, 1200, 4000, 2600], [60, 80, 140, 95, 70]]
  for (let k = 0; k < 18; k++) {
    const ffs = spreads[k % spreads.length]!.map(v => v * (1 + k / 20))
    const entry = gridEntry(protocol, ffs)
    out.push({ entry, seriesText: null, ...storedFieldsOf({ kind: 'quantitative', protocol, entry, passLevel: 100, testedOn: '2026-01-01', retestMonths: 12 }) })
  }
  for (const ff of [1200, 85]) {
    const seriesText = series(protocol, 6000, ff)
    const entry = { mode: 'series', exercises: [], seriesOffsetSeconds: 0, decimalMark: 'point' } as unknown as FitTestEntry
    out.push({ entry, seriesText, ...storedFieldsOf({ kind: 'quantitative', protocol, entry, seriesText, sampleFlowCm3PerMin: 350, passLevel: 100, testedOn: '2026-01-01', retestMonths: 12 }) })
  }
  return out
}

export async function seedBench(pool: pg.Pool, { people, tests }: { people: number, tests: number }, say: (line: string) => void) {
  const protocol = findBuiltInProtocol('osha-standard')!
  const list = templates(protocol)
  const hash = await hashPassword(BENCH_PASSWORD)
  const run = async (label: string, text: string, values: unknown[] = []) => {
    const started = Date.now()
    await pool.query(text, values)
    say(`  ${label} (${((Date.now() - started) / 1000).toFixed(1)} s)`)
  }
  // Ids shaped as version-4 UUIDs (the routes refuse any other), derived from a name so rows can refer to each other.
  await pool.query(`create or replace function bench_uuid(t text) returns uuid language sql immutable as
    $$ select (substr(md5(t), 1, 12) || '4' || substr(md5(t), 14, 3) || '8' || substr(md5(t), 18, 15))::uuid $$`)
  await run('organization, sites, tester, catalogue, counters', `
    insert into organizations (id, name, slug) values ('${ORG}', 'Bench Works (invented)', 'bench-api-works');
    insert into sites (id, organization_id, name, time_zone)
      select bench_uuid('site' || i), '${ORG}', 'Bench site ' || i, case when i % 2 = 0 then 'America/Chicago' else 'Europe/London' end from generate_series(1, 4) i;
    insert into users (id, organization_id, email, display_name, role, password_hash)
      select bench_uuid('tester' || i), '${ORG}', case when i = 1 then '${BENCH_EMAIL}' else 'tester' || i || '@bench.example' end, 'Bench tester ' || i, 'tester', '${hash}' from generate_series(1, 12) i;
    insert into respirator_models (id, organization_id, make, model, respirator_class, sizes)
      select bench_uuid('model' || i), '${ORG}', 'Bench make ' || (i % 3), 'BM-' || i, 'elastomeric-half-mask', '["S","M","L"]'::jsonb from generate_series(1, 6) i;
    insert into counters (id, organization_id, site_id, serial_number, description, sample_flow_cm3_per_min, calibration_due_on)
      select bench_uuid('counter' || i), '${ORG}', bench_uuid('site' || (1 + i % 4)), 'BC-' || i, 'Bench counter', 350, '2030-01-01' from generate_series(1, 8) i;
    insert into people (id, organization_id, site_id, full_name, employee_number, job_title, medical_clearance_status, medical_clearance_on)
      select bench_uuid('person' || i), '${ORG}', bench_uuid('site' || (1 + i % 4)), 'Person ' || lpad(i::text, 5, '0'), 'BN-' || i, 'Operator', 'cleared', '2026-01-15' from generate_series(1, ${people}) i;`)
  await pool.query('create temporary table bench_templates (n int, entry jsonb, series_text text, evaluation jsonb, overall float8, lower_bound boolean, passed boolean, limiting text)')
  await pool.query(`insert into bench_templates select * from jsonb_to_recordset($1::jsonb) as x(n int, entry jsonb, series_text text, evaluation jsonb, overall float8, lower_bound boolean, passed boolean, limiting text)`, [
    JSON.stringify(list.map((t, n) => ({ n, entry: t.entry, series_text: t.seriesText, evaluation: t.evaluation, overall: t.stored.overallFitFactor, lower_bound: t.stored.overallIsLowerBound, passed: t.stored.passed, limiting: t.stored.limitingExerciseKey })))
  ])
  // Every 20th test reads a series (templates 18 and 19); the rest are typed grids.
  await run(`${tests.toLocaleString('en')} finished fit tests`, `
    insert into fit_tests (id, organization_id, record_id, status, version, person_id, site_id, tester_user_id, counter_id, respirator_model_id,
      respirator_make, respirator_model, respirator_class, respirator_size, kind, protocol_key, protocol, sample_flow_cm3_per_min, performed_at, pre_test, entry,
      series_text, series_sha256, evaluation, pass_level, overall_fit_factor, overall_is_lower_bound, passed, limiting_exercise_key, due_on, finished_at, finished_by_user_id)
    select bench_uuid('test' || a.i), '${ORG}', bench_uuid('record' || a.i), 'finished', 2, bench_uuid('person' || (1 + a.i % ${people})),
      bench_uuid('site' || (1 + (a.i % ${people}) % 4)), bench_uuid('tester' || (1 + a.i % 12)), bench_uuid('counter' || (1 + a.i % 8)), bench_uuid('model' || (1 + a.i % 6)),
      'Bench make ' || ((1 + a.i % 6) % 3), 'BM-' || (1 + a.i % 6), 'elastomeric-half-mask', (array['S','M','L'])[1 + a.i % 3],
      'quantitative', 'osha-standard', $1::jsonb, 350, a.at,
      '{"medicalClearanceCurrent":true,"nothingCrossingSeal":true,"userSealCheckDone":true,"comfortAcceptable":true}'::jsonb, t.entry,
      t.series_text, case when t.series_text is null then null else encode(sha256(convert_to(t.series_text, 'UTF8')), 'hex') end, t.evaluation,
      100, t.overall, t.lower_bound, t.passed, t.limiting, case when t.passed then (a.at + interval '1 year')::date end, a.at + interval '9 minutes', bench_uuid('tester' || (1 + a.i % 12))
    from (select i, now() - interval '3 years' + (i::float / ${tests}) * interval '3 years' as at from generate_series(1, ${tests}) i) a
    join bench_templates t on t.n = case when a.i % 20 = 0 then 18 + (a.i / 20) % 2 else a.i % 18 end`, [JSON.stringify(protocol)])
  await run('fit cards of passing tests', `
    insert into fit_cards (organization_id, record_id, fit_test_id, token)
      select organization_id, record_id, id, md5('card' || id::text) from fit_tests where organization_id = '${ORG}' and passed`)
  await pool.query('analyze')
}

/** A finished test read from a series, and a person with several tests, for the detail routes. */
export async function benchTargets(pool: pg.Pool) {
  const { rows: [test] } = await pool.query(`select id from fit_tests where organization_id = $1 and series_text is not null order by performed_at desc limit 1`, [ORG])
  const { rows: [person] } = await pool.query(`select person_id as id from fit_tests where organization_id = $1 group by person_id order by count(*) desc, person_id limit 1`, [ORG])
  return { testId: test.id as string, personId: person.id as string }
}
