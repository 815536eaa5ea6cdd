// `npm start` (and `npm run dev` with --dev): everything from a fresh clone to a served app.
import { fileURLToPath } from 'node:url'
import { join } from 'node:path'
import { ensureDependencies } from './lib/deps.mjs'
import { die, log } from './lib/log.mjs'
import { run } from './lib/run.mjs'
import { sessionPassword } from './lib/secrets.mjs'
import { shutdownOnExit } from './lib/shutdown.mjs'

const projectDir = fileURLToPath(new URL('..', import.meta.url))
const dev = process.argv.includes('--dev')
// The demo scenario (with its well-known passwords) goes only into the private cluster this command
// created, or into another database when asked for explicitly.
const demoAsked = process.argv.includes('--demo')
const port = Number(process.env.SEALWRIGHT_PORT || 3000)
const pgPort = Number(process.env.SEALWRIGHT_PG_PORT || 54329)
const smtpPort = Number(process.env.SEALWRIGHT_SMTP_PORT || 2525)
const mailHttpPort = Number(process.env.SEALWRIGHT_MAIL_HTTP_PORT || 8025)
const externalSmtp = process.env.NUXT_MAIL_SMTP_URL

const { stops, exitAfterStopping: shutdown } = shutdownOnExit({
  onStopping: () => log.step('Stopping…'),
  onStopped: () => log.ok('Stopped.')
})

try {
  await ensureDependencies(projectDir)
  const { ensureDatabaseServer, startMailCatcher, startBuiltApp, startService, appEnv, httpOk } = await import('./lib/services.mjs')
  const { prepareDatabase, isEmpty, hasDemoAccounts, hasNoAccount } = await import('./lib/database.mjs')
  const { ensureBuild } = await import('./lib/build.mjs')
  const { demoSignIns, DEMO_PASSWORD } = await import('./seed/demo-accounts.mjs')

  const server = await ensureDatabaseServer(projectDir, { externalUrl: process.env.NUXT_DATABASE_URL, port: pgPort })
  stops.push(server.stop)
  log.step('Applying migrations…')
  const { ownerUrl, appUrl, separated } = await prepareDatabase(server, 'sealwright', { passwords: server.passwords, ownerUrl: process.env.SEALWRIGHT_DATABASE_OWNER_URL })
  if (!separated) log.warn('The app and the migrations share one database role; set SEALWRIGHT_DATABASE_OWNER_URL to migrate as the owner (see README).')
  const empty = await isEmpty(ownerUrl)
  const loadDemo = empty && (!server.external || demoAsked)
  if (loadDemo) {
    log.step('First run: loading the demo scenario…')
    const code = await run(join(projectDir, 'node_modules', '.bin', 'tsx'), ['scripts/seed-demo.ts'], { cwd: projectDir, env: { ...process.env, DATABASE_URL: ownerUrl } })
    if (code !== 0) throw new Error('Loading the demo scenario failed; see the messages above.')
  } else if (empty) {
    log.ok('Database ready. It is empty and holds no account: no demo accounts are created in a database you provided.')
  } else {
    log.ok(demoAsked ? 'Database ready. It already holds data, so the demo scenario was not loaded.' : 'Database ready.')
  }
  const showDemo = await hasDemoAccounts(ownerUrl)
  const needsAdmin = !showDemo && await hasNoAccount(ownerUrl)

  let smtpUrl = externalSmtp
  let outboxUrl = ''
  if (!smtpUrl) {
    const mail = await startMailCatcher(projectDir, { smtpPort, httpPort: mailHttpPort, file: join(projectDir, '.data', 'outbox.jsonl') })
    stops.push(mail.stop)
    smtpUrl = `smtp://127.0.0.1:${smtpPort}`
    outboxUrl = `http://127.0.0.1:${mailHttpPort}`
  }

  const env = appEnv({ databaseUrl: appUrl, sessionPassword: sessionPassword(join(projectDir, '.data', 'session-password')), port, smtpUrl, outboxUrl })
  if (dev) {
    const app = await startService('dev', join(projectDir, 'node_modules', '.bin', 'nuxt'), ['dev', '--host', '127.0.0.1', '--port', String(port)], {
      cwd: projectDir, env, timeoutMs: 120_000, ready: () => httpOk(`http://127.0.0.1:${port}/api/health`)
    })
    stops.push(app.stop)
    app.child.on('exit', () => shutdown(1))
  } else {
    await ensureBuild(projectDir)
    const app = await startBuiltApp(projectDir, env)
    stops.push(app.stop)
    app.child.on('exit', () => shutdown(1))
  }

  log.plain('')
  log.ok(`Sealwright is running at ${log.bold(`http://127.0.0.1:${port}`)}${dev ? ' (hot reload)' : ''}`)
  log.plain('')
  if (showDemo) {
    log.plain(`Demo sign-ins (password for every account: ${DEMO_PASSWORD}):`)
    let lastOrg = ''
    for (const row of demoSignIns()) {
      if (row.organization !== lastOrg) {
        log.plain(`  ${row.organization}`)
        lastOrg = row.organization
      }
      log.plain(`    ${row.role.padEnd(9)} ${row.email}`)
    }
  } else if (needsAdmin) {
    log.plain('No account exists yet. Create the first program admin (it prints a link to set the password):')
    log.plain('  NUXT_DATABASE_URL=… npm run admin:create -- --email you@example.org --name "Your Name" --organization "Your Program" --rule-set us-osha')
    log.plain('To try the product with invented data instead, use an empty database and `npm start -- --demo`.')
  }
  if (outboxUrl) log.plain('\nMail is caught locally; admins read it on the Outbox page.')
  log.plain('Press Ctrl-C to stop.')
} catch (error) {
  log.fail(error?.message ?? String(error))
  await shutdown(1)
}

process.on('unhandledRejection', error => die(String(error?.message ?? error)))
