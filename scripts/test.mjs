// `npm test`: the whole suite on a fresh test database (never the demo database), starting what it needs.
// Lint and typecheck (before any service starts), then vitest's unit, api and e2e projects against a built app on its own ports.
import { fileURLToPath } from 'node:url'
import { join } from 'node:path'
import { randomBytes } from 'node:crypto'
import { ensureDependencies } from './lib/deps.mjs'
import { log } from './lib/log.mjs'
import { run } from './lib/run.mjs'
import { shutdownOnExit } from './lib/shutdown.mjs'

const projectDir = fileURLToPath(new URL('..', import.meta.url))
const bin = name => join(projectDir, 'node_modules', '.bin', name)
const appPort = Number(process.env.SEALWRIGHT_TEST_PORT || 3100)
const pgPort = Number(process.env.SEALWRIGHT_PG_PORT || 54329)
const smtpPort = Number(process.env.SEALWRIGHT_TEST_SMTP_PORT || 2526)
const mailHttpPort = Number(process.env.SEALWRIGHT_TEST_MAIL_HTTP_PORT || 8026)
const vitestArgs = process.argv.slice(2)

const { stops, stopAll } = shutdownOnExit({ signalCode: 130 })

const results = []
async function stage(name, fn) {
  const started = Date.now()
  log.step(`${name}…`)
  const ok = await fn()
  const seconds = ((Date.now() - started) / 1000).toFixed(1)
  results.push({ name, ok, seconds })
  if (ok) log.ok(`${name} (${seconds} s)`)
  else log.fail(`${name} failed (${seconds} s)`)
  return ok
}

let exitCode = 1
try {
  await ensureDependencies(projectDir)
  // The cheap checks first, before any service starts: a lint or type error shows in seconds.
  const lintOk = await stage('Lint (eslint)', async () => await run(bin('eslint'), ['.', '--max-warnings=0'], { cwd: projectDir }) === 0)
  const typesOk = await stage('Typecheck (nuxt typecheck)', async () => await run(bin('nuxt'), ['typecheck'], { cwd: projectDir }) === 0)

  const { ensureDatabaseServer, startMailCatcher, startBuiltApp, appEnv } = await import('./lib/services.mjs')
  const { prepareDatabase } = await import('./lib/database.mjs')
  const { ensureBuild } = await import('./lib/build.mjs')

  const buildOk = await stage('Build', async () => {
    await ensureBuild(projectDir)
    return true
  })

  const testDbUrl = process.env.NUXT_TEST_DATABASE_URL
  const server = await ensureDatabaseServer(projectDir, { externalUrl: testDbUrl, port: pgPort })
  stops.push(server.stop)
  // The tests' fixtures write as the owner; the app under test connects as its own role.
  const { ownerUrl: databaseUrl, appUrl } = await prepareDatabase(server, 'sealwright_test', { recreate: true, passwords: server.passwords, ownerUrl: process.env.SEALWRIGHT_TEST_DATABASE_OWNER_URL })
  // The test database gets the demo scenario too, so the e2e tests can sign in as the demo roles.
  const seeded = await run(bin('tsx'), ['scripts/seed-demo.ts'], { cwd: projectDir, env: { ...process.env, DATABASE_URL: databaseUrl } })
  if (seeded !== 0) throw new Error('Loading the demo scenario into the test database failed.')

  const mail = await startMailCatcher(projectDir, { smtpPort, httpPort: mailHttpPort, quiet: true })
  stops.push(mail.stop)
  const env = appEnv({
    databaseUrl: appUrl,
    sessionPassword: randomBytes(32).toString('hex'),
    port: appPort,
    smtpUrl: `smtp://127.0.0.1:${smtpPort}`,
    outboxUrl: `http://127.0.0.1:${mailHttpPort}`,
    trustProxy: true
  })
  const app = await startBuiltApp(projectDir, env, { quiet: true })
  stops.push(app.stop)

  const testsOk = await stage('Tests (vitest: unit, api, e2e)', async () => await run(bin('vitest'), ['run', ...vitestArgs], {
    cwd: projectDir,
    env: {
      ...process.env,
      SEALWRIGHT_TEST_BASE_URL: `http://127.0.0.1:${appPort}`,
      SEALWRIGHT_TEST_DATABASE_URL: databaseUrl,
      SEALWRIGHT_TEST_APP_DATABASE_URL: appUrl,
      SEALWRIGHT_TEST_OUTBOX_URL: `http://127.0.0.1:${mailHttpPort}`,
      SEALWRIGHT_TEST_SESSION_PASSWORD: env.NUXT_SESSION_PASSWORD,
      // Lets a test start a second app instance on the same database and mail catcher.
      SEALWRIGHT_TEST_APP_ENV: JSON.stringify(env)
    }
  }) === 0)

  if (!testsOk) {
    // What the app and the mail catcher printed last: the server side of a failing test.
    for (const [name, service] of [['app', app], ['mail', mail]]) log.plain(`\nLast output of the ${name} under test:\n${service.tail() || '(nothing)'}`)
  }
  exitCode = lintOk && typesOk && buildOk && testsOk ? 0 : 1
} catch (error) {
  log.fail(error?.message ?? String(error))
}
await stopAll()
log.plain('')
for (const r of results) log.plain(`  ${r.ok ? '✓' : '✗'} ${r.name.padEnd(34)} ${r.seconds.padStart(6)} s`)
log.plain(exitCode === 0 ? '\nAll checks passed.' : '\nSome checks failed: see above.')
process.exit(exitCode)
