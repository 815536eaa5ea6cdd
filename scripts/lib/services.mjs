// Starting and stopping what the app needs: PostgreSQL, the mail catcher, the app server.
import { spawn } from 'node:child_process'
import { join } from 'node:path'
import { ensureCluster, resolveClusterDir } from './postgres.mjs'
import { log } from './log.mjs'
import { databasePasswords } from './secrets.mjs'
import { waitFor } from './run.mjs'

/** The database server: NUXT_DATABASE_URL when given (no cluster started), else our private cluster. */
export async function ensureDatabaseServer(projectDir, { externalUrl, port }) {
  if (externalUrl) {
    log.ok('Using the database in NUXT_DATABASE_URL; no private cluster started.')
    return { serverUrl: externalUrl, external: true, stop: () => {} }
  }
  const dataDir = resolveClusterDir(projectDir, 'pg')
  const passwords = databasePasswords(join(projectDir, '.data', 'database-passwords.json'))
  const cluster = await ensureCluster({ dataDir, port, superuserPassword: passwords.superuser })
  log.ok(`PostgreSQL on 127.0.0.1:${port} (${cluster.owned ? 'started here' : 'already running'})`)
  return { serverUrl: cluster.url('postgres'), external: false, passwords, stop: () => cluster.owned && cluster.stop() }
}

/** Spawns a long-running child whose output is prefixed; resolves once `ready()` answers. */
export async function startService(name, command, args, { env, cwd, ready, timeoutMs = 30_000, quiet = false }) {
  const child = spawn(command, args, { cwd, env: { ...process.env, ...env }, stdio: ['ignore', 'pipe', 'pipe'] })
  const prefix = line => `[${name}] ${line}`
  const out = []
  const onData = stream => (chunk) => {
    for (const line of chunk.toString().split('\n').filter(Boolean)) {
      out.push(line)
      if (out.length > 50) out.shift()
      if (!quiet) stream.write(`${prefix(line)}\n`)
    }
  }
  child.stdout.on('data', onData(process.stdout))
  child.stderr.on('data', onData(process.stderr))
  let exited = null
  child.on('exit', (code) => {
    exited = code ?? 1
  })
  const ok = await waitFor(async () => {
    if (exited !== null) throw new Error('exited')
    return ready()
  }, { timeoutMs })
  if (!ok || exited !== null) {
    child.kill('SIGTERM')
    throw new Error(`${name} did not start. Its last output:\n${out.join('\n')}`)
  }
  return {
    child,
    /** The last 50 lines it printed, for a failure report. */
    tail: () => out.join('\n'),
    stop: () => new Promise((resolve) => {
      if (exited !== null) return resolve()
      child.once('exit', () => resolve())
      child.kill('SIGTERM')
      setTimeout(() => child.kill('SIGKILL'), 5000).unref()
    })
  }
}

export async function httpOk(url) {
  try {
    const response = await fetch(url, { signal: AbortSignal.timeout(2000) })
    return response.ok
  } catch {
    return false
  }
}

export function startMailCatcher(projectDir, { smtpPort, httpPort, file, quiet }) {
  return startService('mail', process.execPath, [join(projectDir, 'scripts', 'fake-smtp.mjs')], {
    cwd: projectDir,
    quiet,
    env: { SEALWRIGHT_SMTP_PORT: String(smtpPort), SEALWRIGHT_MAIL_HTTP_PORT: String(httpPort), SEALWRIGHT_MAIL_FILE: file ?? '' },
    ready: () => httpOk(`http://127.0.0.1:${httpPort}/health`)
  })
}

/** The environment the built server or `nuxt dev` runs with. */
export function appEnv({ databaseUrl, sessionPassword, port, smtpUrl, outboxUrl, trustProxy = false }) {
  return {
    NUXT_DATABASE_URL: databaseUrl,
    NUXT_SESSION_PASSWORD: sessionPassword,
    NUXT_MAIL_SMTP_URL: smtpUrl,
    NUXT_MAIL_OUTBOX_URL: outboxUrl,
    NUXT_PUBLIC_BASE_URL: `http://127.0.0.1:${port}`,
    NUXT_TRUST_PROXY: trustProxy ? 'true' : 'false',
    HOST: '127.0.0.1',
    NITRO_HOST: '127.0.0.1',
    PORT: String(port),
    NITRO_PORT: String(port)
  }
}

export function startBuiltApp(projectDir, env, { quiet = false } = {}) {
  return startService('app', process.execPath, [join(projectDir, '.output', 'server', 'index.mjs')], {
    cwd: projectDir,
    env,
    quiet,
    timeoutMs: 60_000,
    ready: () => httpOk(`http://127.0.0.1:${env.PORT}/api/health`)
  })
}
