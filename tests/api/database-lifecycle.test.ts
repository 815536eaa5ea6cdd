// The database lifecycle the start and test commands rely on, on a cluster of its own (own folder,
// own port) so the suite's database is never disturbed: start twice, recover from SIGKILL, and an
// app that answers 503 while PostgreSQL is down and recovers by itself.
import { readFileSync, rmSync, writeFileSync } from 'node:fs'
import { join } from 'node:path'
import pg from 'pg'
import { afterAll, describe, expect, it } from 'vitest'
// @ts-expect-error plain JavaScript helpers shared with the start command
import { ensureCluster, postmasterPid, resolveClusterDir, stopCluster, findPostgresBin } from '../../scripts/lib/postgres.mjs'
// @ts-expect-error plain JavaScript helpers shared with the start command
import { applyMigrations, ensureDatabase } from '../../scripts/lib/database.mjs'
// @ts-expect-error plain JavaScript helpers shared with the start command
import { appEnv, startBuiltApp } from '../../scripts/lib/services.mjs'
// @ts-expect-error plain JavaScript helpers shared with the start command
import { waitFor } from '../../scripts/lib/run.mjs'
import { projectDir } from '../support/env'

// Ports beside the suite's own, so two checkouts testing at once never meet.
const port = Number(process.env.SEALWRIGHT_PG_PORT || 54329) + 10
const dataDir: string = resolveClusterDir(projectDir, 'pg-lifecycle-test')
const appPort = Number(process.env.SEALWRIGHT_TEST_PORT || 3100) + 99
// Invented for this throwaway cluster only.
const superuserPassword = 'lifecycle-check-password-0001'
let stopApp: (() => Promise<void>) | undefined

async function answers(url: string) {
  const client = new pg.Client({ connectionString: url, connectionTimeoutMillis: 2000 })
  try {
    await client.connect()
    const { rows } = await client.query('select 1 as one')
    return rows[0].one === 1
  } finally {
    await client.end().catch(() => {})
  }
}

afterAll(async () => {
  await stopApp?.()
  stopCluster(findPostgresBin(), dataDir)
  rmSync(dataDir, { recursive: true, force: true })
  rmSync(`${dataDir}.log`, { force: true })
})

describe('the private cluster', () => {
  it('starts from nothing, then a second start reuses it', async () => {
    rmSync(dataDir, { recursive: true, force: true })
    const first = await ensureCluster({ dataDir, port, superuserPassword })
    expect(await answers(first.url())).toBe(true)
    const pid = postmasterPid(dataDir)
    const second = await ensureCluster({ dataDir, port, superuserPassword })
    expect(second.owned).toBe(true)
    expect(postmasterPid(dataDir)).toBe(pid)
    expect(await answers(second.url())).toBe(true)
  })

  it('asks for a password over TCP: none, or a wrong one, is refused', async () => {
    const cluster = await ensureCluster({ dataDir, port, superuserPassword })
    const withoutPassword = new URL(cluster.url())
    withoutPassword.password = ''
    // The server asks for a password (scram); a client without one cannot even answer the challenge.
    await expect(answers(withoutPassword.toString())).rejects.toThrow(/password/i)
    const wrong = new URL(cluster.url())
    wrong.password = 'not-the-password'
    // 28P01: invalid_password (PostgreSQL documentation, Appendix A).
    await expect(answers(wrong.toString())).rejects.toMatchObject({ code: '28P01' })
  })

  it('switches a cluster made with the old rules (trust for everyone) to passwords on the next start', async () => {
    const hba = join(dataDir, 'pg_hba.conf')
    writeFileSync(hba, 'local all all trust\nhost all all 127.0.0.1/32 trust\n')
    stopCluster(findPostgresBin(), dataDir)
    const cluster = await ensureCluster({ dataDir, port, superuserPassword })
    expect(readFileSync(hba, 'utf8')).toMatch(/scram-sha-256/)
    const withoutPassword = new URL(cluster.url())
    withoutPassword.password = ''
    // The server asks for a password (scram); a client without one cannot even answer the challenge.
    await expect(answers(withoutPassword.toString())).rejects.toThrow(/password/i)
    expect(await answers(cluster.url())).toBe(true)
  })

  it('recovers after the postmaster is killed with SIGKILL', async () => {
    const pid = postmasterPid(dataDir)
    expect(pid).toBeGreaterThan(0)
    process.kill(pid!, 'SIGKILL')
    await waitFor(() => {
      try {
        process.kill(pid!, 0)
        return false
      } catch {
        return true
      }
    }, { timeoutMs: 10_000 })
    const again = await ensureCluster({ dataDir, port, superuserPassword })
    expect(await answers(again.url())).toBe(true)
    expect(postmasterPid(dataDir)).not.toBe(pid)
  })
})

describe('the app while PostgreSQL is down', () => {
  it('answers 503 with a plain message, then recovers by itself', async () => {
    const cluster = await ensureCluster({ dataDir, port, superuserPassword })
    const databaseUrl = await ensureDatabase(cluster.url(), 'outage_check')
    await applyMigrations(databaseUrl)
    const env = appEnv({ databaseUrl, sessionPassword: 'x'.repeat(40), port: appPort, smtpUrl: 'smtp://127.0.0.1:9', outboxUrl: '' })
    const app = await startBuiltApp(projectDir, env, { quiet: true })
    stopApp = app.stop
    const base = `http://127.0.0.1:${appPort}`
    expect((await fetch(`${base}/api/health`)).status).toBe(200)

    stopCluster(findPostgresBin(), dataDir)
    const health = await fetch(`${base}/api/health`)
    expect(health.status).toBe(503)
    expect((await health.json()).database).toBe('down')
    const signIn = await fetch(`${base}/api/auth/sign-in`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email: 'someone@fixture.example', password: 'anything-at-all' }) })
    expect(signIn.status).toBe(503)
    expect((await signIn.json()).message).toMatch(/database is unavailable; nothing was changed/)

    await ensureCluster({ dataDir, port, superuserPassword })
    const recovered = await waitFor(async () => (await fetch(`${base}/api/health`)).status === 200, { timeoutMs: 15_000 })
    expect(recovered).toBe(true)
    const after = await fetch(`${base}/api/auth/sign-in`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email: 'someone@fixture.example', password: 'anything-at-all' }) })
    expect(after.status).toBe(401)
  })
})
