// The app's own database role cannot rewrite history: it may add to the audit trail and read it,
// but not truncate, change or delete it, not switch off triggers, not turn on replica mode, and a
// finished fit-test revision refuses every change except the app's own status transitions.
import pg from 'pg'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { closeTestDb, testDb } from '../support/fixtures'
import { appDatabaseUrl } from '../support/env'
import * as schema from '../../server/database/schema'
import { eq } from 'drizzle-orm'

let app: pg.Client
let finishedId: string

beforeAll(async () => {
  app = new pg.Client({ connectionString: appDatabaseUrl })
  await app.connect()
  // The demo scenario (loaded into the test database) holds finished records.
  const [row] = await testDb().select({ id: schema.fitTests.id }).from(schema.fitTests).where(eq(schema.fitTests.status, 'finished')).limit(1)
  finishedId = row!.id
})
afterAll(async () => {
  await app?.end()
  await closeTestDb()
})

async function refusal(sql: string, values: unknown[] = []) {
  try {
    await app.query(sql, values)
    return 'allowed'
  } catch (error) {
    return (error as { code?: string }).code ?? 'error'
  }
}

// 42501 is PostgreSQL's insufficient_privilege (PostgreSQL documentation, Appendix A: error codes).
describe('the app role and the audit trail', () => {
  it('is not the superuser and does not own the tables', async () => {
    const { rows } = await app.query('select current_user as name, rolsuper from pg_roles where rolname = current_user')
    expect(rows[0].rolsuper).toBe(false)
    const owned = await app.query('select count(*)::int as n from pg_tables where schemaname = \'public\' and tableowner = current_user')
    expect(owned.rows[0].n).toBe(0)
  })

  it('may read the trail and append to it', async () => {
    expect(await refusal('select id from audit_events limit 1')).toBe('allowed')
  })

  it('cannot truncate, update or delete it', async () => {
    expect(await refusal('truncate audit_events')).toBe('42501')
    expect(await refusal('update audit_events set action = \'rewritten\'')).toBe('42501')
    expect(await refusal('delete from audit_events')).toBe('42501')
  })

  it('cannot switch off the append-only trigger or go around it', async () => {
    expect(await refusal('alter table audit_events disable trigger all')).toBe('42501')
    expect(await refusal('set session_replication_role = replica')).toBe('42501')
    expect(await refusal('drop trigger audit_events_append_only on audit_events')).toBe('42501')
  })
})

describe('the app role and finished fit-test revisions', () => {
  it('cannot change the numbers or the wearer of a finished revision', async () => {
    expect(await refusal('update fit_tests set overall_fit_factor = 9999, passed = true where id = $1', [finishedId])).toBe('SW001')
    expect(await refusal('update fit_tests set person_id = person_id, entry = \'{}\'::jsonb where id = $1', [finishedId])).toBe('SW001')
  })

  it('cannot delete a finished revision or bring it back to draft', async () => {
    expect(await refusal('delete from fit_tests where id = $1', [finishedId])).toBe('SW001')
    expect(await refusal('update fit_tests set status = \'draft\' where id = $1', [finishedId])).toBe('SW001')
  })

  it('cannot truncate the records', async () => {
    expect(await refusal('truncate fit_tests cascade')).toBe('42501')
  })

  it('may still make the transitions the app makes, inside a transaction rolled back here', async () => {
    await app.query('begin')
    try {
      expect(await refusal('update fit_tests set status = \'withdrawn\', withdrawn_reason = \'check only\', version = version + 1 where id = $1', [finishedId])).toBe('allowed')
    } finally {
      await app.query('rollback')
    }
  })
})
