import { execFileSync } from 'node:child_process'
import { randomUUID } from 'node:crypto'
import { join } from 'node:path'
import { eq } from 'drizzle-orm'
import { afterAll, describe, expect, it } from 'vitest'
import * as schema from '../../server/database/schema'
import { Client } from '../support/http'
import { closeTestDb, testDb } from '../support/fixtures'
import { databaseUrl, projectDir } from '../support/env'

// The first program admin of a real database comes from `npm run admin:create` (issue 8, item 9):
// an organization, a site and an admin without a password, and a single-use link to set it.

afterAll(closeTestDb)

function adminCreate(args: string[]) {
  try {
    return { code: 0, out: execFileSync(join(projectDir, 'node_modules', '.bin', 'tsx'), ['scripts/admin-create.ts', ...args], { cwd: projectDir, env: { ...process.env, NUXT_DATABASE_URL: databaseUrl }, stdio: 'pipe' }).toString() }
  } catch (error) {
    const failed = error as { status: number, stderr: Buffer }
    return { code: failed.status, out: failed.stderr.toString() }
  }
}

describe('npm run admin:create', () => {
  it('creates the organization and an admin who sets a password through the printed link', async () => {
    const email = `first-admin-${randomUUID().slice(0, 8)}@fixture.example`
    const made = adminCreate(['--email', email, '--name', 'First Admin', '--organization', `Fixture Program ${randomUUID().slice(0, 4)}`, '--rule-set', 'uk-hse', '--time-zone', 'Europe/London', '--base-url', 'http://127.0.0.1:1'])
    expect(made.code, made.out).toBe(0)
    const [user] = await testDb().select().from(schema.users).where(eq(schema.users.email, email))
    expect(user).toMatchObject({ role: 'admin', passwordHash: null, active: true })
    const [org] = await testDb().select().from(schema.organizations).where(eq(schema.organizations.id, user!.organizationId))
    expect(org!.ruleSet).toBe('uk-hse')
    const token = /set-password\?token=([\w-]+)/.exec(made.out)?.[1]
    expect(token).toBeTruthy()
    const client = new Client()
    expect((await client.post(`/api/auth/tokens/${token}`, { password: 'a-long-enough-password', confirm: 'a-long-enough-password' })).status).toBe(200)
    expect((await new Client().post('/api/auth/sign-in', { email, password: 'a-long-enough-password' })).status).toBe(200)
  }, 180_000)

  it('refuses an existing e-mail and a missing option, saying what to give', async () => {
    const again = adminCreate(['--email', 'admin@tamsin-valley.example', '--name', 'X', '--organization', 'Y'])
    expect(again.code).toBe(1)
    expect(again.out).toMatch(/already exists; nothing was created/)
    const missing = adminCreate(['--email', 'someone@fixture.example'])
    expect(missing.code).toBe(1)
    expect(missing.out).toMatch(/Give --name/)
  }, 180_000)
})
