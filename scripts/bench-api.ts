// `npm run bench:api`: the read routes against a large invented program, each beside its floor.
// Builds a scratch database (sealwright_bench_api on the private cluster: 2,000 people, 20,000
// finished tests, one in twenty from a 1 Hz series), starts the built app on it, and with autocannon
// measures the detail, list, overview and person routes and their server-rendered pages. For each
// API route the floor is a bare Node http server replaying the statements the route ran during a
// warm-up request (captured by the app's Drizzle logger), once as plain statements (the floor the
// targets use) and once as named prepared statements, as the app sends its busiest reads. Then the
// first-load JavaScript, gzipped, of four pages in headless Chromium. Each page is measured twice:
// asked again and again as it is (sent from the page memo while nothing is written, see
// server/utils/page-memo.ts), and with a different query each time, so that every one is drawn. Prints figures and ratios; asserts nothing; never in npm test.
//   SEALWRIGHT_BENCH_SECONDS (6), SEALWRIGHT_BENCH_CONNECTIONS (10), SEALWRIGHT_BENCH_PEOPLE (2000),
//   SEALWRIGHT_BENCH_TESTS (20000), SEALWRIGHT_BENCH_REUSE=1 keeps the scratch database,
//   SEALWRIGHT_BENCH_PORT (3090; the floor uses the next port), SEALWRIGHT_PG_PORT (54329),
//   SEALWRIGHT_BENCH_ONLY=detail,person measures only the routes whose label starts with those words
//   (SEALWRIGHT_BENCH_ONLY=firstload: no routes, only the first-load JavaScript),
//   SEALWRIGHT_BENCH_PROFILE=<dir> writes a CPU profile of the app (node --cpu-prof) there when it stops,
//   SEALWRIGHT_BENCH_PHASES=api,floor,page measures only those (a profile of the API alone, say).
import { spawn } from 'node:child_process'
import { existsSync, readFileSync, writeFileSync } from 'node:fs'
import { join } from 'node:path'
import { fileURLToPath } from 'node:url'
import autocannon from 'autocannon'
import pg from 'pg'
import { prepareDatabase } from './lib/database.mjs'
import { ensureBuild } from './lib/build.mjs'
import { appEnv, ensureDatabaseServer, httpOk, startBuiltApp, startService } from './lib/services.mjs'
import { sessionPassword } from './lib/secrets.mjs'
import { BENCH_EMAIL, BENCH_PASSWORD, ORG, benchTargets, seedBench } from './bench-api/seed'
import { firstLoadJs } from './bench-api/first-load'

const projectDir = fileURLToPath(new URL('..', import.meta.url))
const env = process.env
const seconds = Number(env.SEALWRIGHT_BENCH_SECONDS || 6)
const connections = Number(env.SEALWRIGHT_BENCH_CONNECTIONS || 10)
const size = { people: Number(env.SEALWRIGHT_BENCH_PEOPLE || 2000), tests: Number(env.SEALWRIGHT_BENCH_TESTS || 20_000) }
const port = Number(env.SEALWRIGHT_BENCH_PORT || 3090)
const floorPort = port + 1
const sqlLog = join(projectDir, '.data', 'bench-api-sql.jsonl')
const stops: (() => unknown)[] = []
const say = (line: string) => process.stdout.write(`${line}\n`)

async function main() {
  const server = await ensureDatabaseServer(projectDir, { externalUrl: env.NUXT_BENCH_DATABASE_URL, port: Number(env.SEALWRIGHT_PG_PORT || 54329) })
  stops.push(server.stop)
  const reuse = env.SEALWRIGHT_BENCH_REUSE === '1'
  const { ownerUrl, appUrl } = await prepareDatabase(server, 'sealwright_bench_api', { recreate: !reuse, passwords: server.passwords })
  const owner = new pg.Pool({ connectionString: ownerUrl, max: 2 })
  const { rows: [{ n }] } = await owner.query('select count(*)::int as n from organizations where id = $1', [ORG])
  if (n === 0) {
    say(`Seeding ${size.people.toLocaleString('en')} people and ${size.tests.toLocaleString('en')} finished tests (invented data)…`)
    const started = Date.now()
    await seedBench(owner, size, say)
    say(`  seeded in ${((Date.now() - started) / 1000).toFixed(1)} s`)
  }
  const { testId, personId } = await benchTargets(owner)
  await owner.end()

  // SEALWRIGHT_BENCH_NO_BUILD=1 measures the build already in .output (a 'before' figure, say).
  if (env.SEALWRIGHT_BENCH_NO_BUILD !== '1') {
    say('Building if needed…')
    await ensureBuild(projectDir)
  }
  writeFileSync(sqlLog, '')
  const appEnvironment = {
    ...appEnv({ databaseUrl: appUrl, sessionPassword: sessionPassword(join(projectDir, '.data', 'session-password')), port, smtpUrl: 'smtp://127.0.0.1:9', outboxUrl: '' }),
    SEALWRIGHT_BENCH_SQL_LOG: sqlLog
  }
  const quiet = env.SEALWRIGHT_BENCH_VERBOSE !== '1'
  const app = env.SEALWRIGHT_BENCH_PROFILE
    ? await startService('app', process.execPath, ['--cpu-prof', `--cpu-prof-dir=${env.SEALWRIGHT_BENCH_PROFILE}`, join(projectDir, '.output', 'server', 'index.mjs')], {
        cwd: projectDir, env: appEnvironment, quiet, timeoutMs: 60_000, ready: () => httpOk(`http://127.0.0.1:${port}/api/health`)
      })
    : await startBuiltApp(projectDir, appEnvironment, { quiet })
  stops.push(app.stop)
  await backfillSettled(ownerUrl)
  const base = `http://127.0.0.1:${port}`
  const signIn = await fetch(`${base}/api/auth/sign-in`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email: BENCH_EMAIL, password: BENCH_PASSWORD }) })
  if (!signIn.ok) throw new Error(`Sign-in failed: ${signIn.status} ${await signIn.text()}`)
  const cookie = signIn.headers.getSetCookie().map(c => c.split(';')[0]).join('; ')
  const headers = { cookie, 'accept-encoding': 'gzip, br' }

  const only = env.SEALWRIGHT_BENCH_ONLY?.split(',').map(w => w.trim()).filter(Boolean)
  const routes = [
    { label: 'fit-test detail (series)', api: `/api/fit-tests/${testId}`, page: `/fit-tests/${testId}` },
    { label: 'fit-test list, 25 a page', api: '/api/fit-tests?pageSize=25', page: '/fit-tests' },
    { label: 'overview', api: '/api/overview', page: '/' },
    { label: 'person', api: `/api/people/${personId}`, page: `/people/${personId}` }
  ].filter(r => !only?.length || only.some(w => r.label.startsWith(w)))
  const summary: string[] = []
  const phases = new Set((env.SEALWRIGHT_BENCH_PHASES || 'api,floor,page').split(',').map(w => w.trim()))
  const skipped: Measured = { rps: Number.NaN, p50: Number.NaN, p99: Number.NaN, errors: 0, bytes: 0 }
  if (env.SEALWRIGHT_BENCH_ONLY === 'firstload') routes.length = 0
  else say(`${connections} connections, ${seconds} s each, ${size.people.toLocaleString('en')} people, ${size.tests.toLocaleString('en')} tests`)
  const header = ['what', 'req/s', 'p50 ms', 'p99 ms', 'errors', 'bytes/req', 'round trips']
  for (const route of routes) {
    say(`\n${route.label}`)
    const statements = await captureStatements(`${base}${route.api}`, headers)
    const api = phases.has('api') ? await measure(`${base}${route.api}`, headers) : skipped
    const floor = phases.has('floor') ? await withFloor(appUrl, statements, false, () => measure(`http://127.0.0.1:${floorPort}/`, {})) : skipped
    const preparedFloor = phases.has('floor') ? await withFloor(appUrl, statements, true, () => measure(`http://127.0.0.1:${floorPort}/`, {})) : skipped
    const page = phases.has('page') ? await measure(`${base}${route.page}`, { ...headers, accept: 'text/html' }) : skipped
    const drawnPage = phases.has('page') ? await measure(`${base}${route.page}`, { ...headers, accept: 'text/html' }, true) : skipped
    table([header,
      [`GET ${route.api.replace(testId, ':id').replace(personId, ':id')}`, ...figures(api), String(statements.length)],
      ['  same SQL on bare pg', ...figures(floor), String(statements.length)],
      ['  same SQL on bare pg, prepared', ...figures(preparedFloor), String(statements.length)],
      [`  page ${route.page.replace(testId, ':id').replace(personId, ':id')}`, ...figures(page), ''],
      ['    the same page drawn every time', ...figures(drawnPage), '']])
    summary.push(`${route.label.padEnd(26)} API/floor ${(api.rps / floor.rps).toFixed(2)}× (target ≥ 0.70; ${(api.rps / preparedFloor.rps).toFixed(2)}× the prepared floor)   page/API ${(page.rps / api.rps).toFixed(2)}× (target ≥ 0.50; ${(drawnPage.rps / api.rps).toFixed(2)}× drawn every time)   round trips ${statements.length} (target ≤ 3)`)
  }
  // What rendering any page costs here, whatever its data: the sign-in form, signed out (no
  // database, no internal request). No page can be served faster than this.
  if (routes.length && phases.has('page')) {
    const bare = await measure(`${base}/sign-in`, { 'accept-encoding': 'gzip, br', 'accept': 'text/html' })
    say('\nthe bare server-rendered page')
    table([header, ['  page /sign-in, signed out', ...figures(bare), '0']])
    summary.push(`${'(bare page)'.padEnd(26)} ${bare.rps.toFixed(0)} req/s: the most any server-rendered page can reach on this machine`)
  }
  say('')
  for (const line of summary) say(line)

  if (only?.length && env.SEALWRIGHT_BENCH_ONLY !== 'firstload') return
  say('\nFirst-load JavaScript (gzipped; target ≤ 150 kB):')
  const loads = await firstLoadJs(base, cookie, [
    { label: 'sign-in', path: '/sign-in', signedIn: false },
    { label: 'overview', path: '/', signedIn: true },
    { label: 'fit-test entry', path: '/fit-tests/new', signedIn: true },
    { label: 'result', path: `/fit-tests/${testId}`, signedIn: true },
    // Not among the four the target names, measured the same way.
    { label: 'fit-test list', path: '/fit-tests', signedIn: true },
    { label: 'person', path: `/people/${personId}`, signedIn: true },
    { label: 'insights', path: '/insights', signedIn: true },
    { label: 'calculator', path: '/calculator', signedIn: true },
    { label: 'training lab', path: '/lab', signedIn: true }
  ])
  for (const [i, l] of loads.entries()) {
    if (i === 4) say('  other pages:')
    say(`  ${l.label.padEnd(16)} ${(l.gzipped / 1024).toFixed(1).padStart(7)} kB gzipped (${(l.raw / 1024).toFixed(0)} kB raw, ${l.files} files)`)
  }

  say('\nCompression and caching:')
  for (const [label, path, accept] of [['HTML', '/sign-in', 'text/html'], ['JSON', '/api/fit-tests?pageSize=25', 'application/json']] as const) {
    const res = await fetch(`${base}${path}`, { headers: { ...headers, accept } })
    say(`  ${label.padEnd(6)} content-encoding: ${res.headers.get('content-encoding') ?? 'none'}`)
  }
  const html = await (await fetch(`${base}/sign-in`)).text()
  const asset = html.match(/\/_nuxt\/[\w.-]+\.js/)?.[0]
  if (asset) {
    const res = await fetch(`${base}${asset}`, { headers })
    say(`  asset  content-encoding: ${res.headers.get('content-encoding') ?? 'none'}; cache-control: ${res.headers.get('cache-control') ?? 'none'}`)
  }
}

/**
 * At start-up the app fills the insight rows of results that were not finished through it (all of
 * the seeded ones); measuring before that work ends would measure it too.
 */
async function backfillSettled(ownerUrl: string) {
  const pool = new pg.Pool({ connectionString: ownerUrl, max: 1 })
  const started = Date.now()
  try {
    for (;;) {
      const { rows: [{ n }] } = await pool.query(`select count(*)::int as n from fit_tests ft where ft.organization_id = $1 and ft.status = 'finished'
        and not exists (select 1 from fit_test_exercise_results e where e.fit_test_id = ft.id)`, [ORG])
      if (n === 0 || Date.now() - started > 300_000) return
      say(`  waiting for the app's start-up backfill of insight rows (${n.toLocaleString('en')} results left)…`)
      await new Promise(resolve => setTimeout(resolve, 5000))
    }
  } catch {
    // A schema without those rows has nothing to wait for.
  } finally {
    await pool.end()
  }
}

/** The statements one request runs: a first request warms caches, the second is recorded. */
async function captureStatements(url: string, headers: Record<string, string>) {
  for (let i = 0, ok = 0; ok < 2; i++) {
    writeFileSync(sqlLog, '')
    const res = await fetch(url, { headers: { ...headers, 'x-sealwright-bench-capture': '1' } })
    const body = await res.text()
    if (res.ok) ok++
    // Under load the app may still be catching up with the previous run: wait and retry.
    else if (i > 8) throw new Error(`${url} answered ${res.status}: ${body.slice(0, 300)}`)
    else await new Promise(resolve => setTimeout(resolve, 2000))
  }
  await new Promise(resolve => setTimeout(resolve, 200))
  return readFileSync(sqlLog, 'utf8').split('\n').filter(Boolean).map(line => JSON.parse(line) as { query: string, params: unknown[] })
}

async function withFloor<T>(databaseUrl: string, statements: unknown[], prepared: boolean, body: () => Promise<T>): Promise<T> {
  const file = join(projectDir, '.data', 'bench-api-floor.json')
  writeFileSync(file, JSON.stringify(statements))
  const child = spawn(process.execPath, [join(projectDir, 'scripts', 'bench-api', 'floor-server.mjs')], {
    env: { ...env, FLOOR_DATABASE_URL: databaseUrl, FLOOR_STATEMENTS: file, FLOOR_PORT: String(floorPort), FLOOR_PREPARED: prepared ? '1' : '0' },
    stdio: ['ignore', 'pipe', 'inherit']
  })
  await new Promise<void>((resolve, reject) => {
    child.stdout.once('data', () => resolve())
    child.once('exit', code => reject(new Error(`The floor server stopped (${code}).`)))
  })
  try {
    return await body()
  } finally {
    child.kill('SIGTERM')
  }
}

interface Measured { rps: number, p50: number, p99: number, errors: number, bytes: number }

/** `drawEach`: every request asks a different address (`?draw=n`), so the page memo never answers. */
async function measure(url: string, headers: Record<string, string>, drawEach = false): Promise<Measured> {
  let n = 0
  const requests = drawEach ? [{ setupRequest: (request: { path: string }) => ({ ...request, path: `${request.path}${request.path.includes('?') ? '&' : '?'}draw=${n++}` }) }] : undefined
  const r = await autocannon({ url, connections, duration: seconds, headers, requests })
  // Let queued work drain before the next run.
  await new Promise(resolve => setTimeout(resolve, 2000))
  const errors = r.errors + r.non2xx + r.timeouts
  return { rps: r.requests.average, p50: r.latency.p50, p99: r.latency.p99, errors, bytes: r.requests.total ? Math.round(r.throughput.total / r.requests.total) : 0 }
}

function figures(m: Measured) {
  return [m.rps.toFixed(0), m.p50.toFixed(1), m.p99.toFixed(1), String(m.errors), m.bytes.toLocaleString('en')]
}

function table(lines: string[][]) {
  const widths = lines[0]!.map((_, i) => Math.max(...lines.map(l => (l[i] ?? '').length)))
  for (const l of lines) say(l.map((cell, i) => (i === 0 ? cell.padEnd(widths[i]!) : cell.padStart(widths[i]!))).join('  '))
}

for (const signal of ['SIGINT', 'SIGTERM'] as const) {
  process.once(signal, async () => {
    for (const stop of stops.reverse()) await stop()
    process.exit(130)
  })
}

try {
  if (!existsSync(join(projectDir, 'node_modules', 'autocannon'))) throw new Error('Run npm ci first.')
  await main()
} catch (error) {
  console.error(error instanceof Error ? error.message : error)
  process.exitCode = 1
} finally {
  for (const stop of stops.reverse()) await stop()
}
