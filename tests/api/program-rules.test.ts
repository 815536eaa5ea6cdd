import { randomUUID } from 'node:crypto'
import { eq } from 'drizzle-orm'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import * as schema from '../../server/database/schema'
import { STANDARD_PROTOCOL } from '../../shared/utils/compute'
import { signedIn } from '../support/http'
import type { Client } from '../support/http'
import { closeTestDb, createOrganization, createProgram, testDb } from '../support/fixtures'
import type { FixtureOrganization, FixtureProgram } from '../support/fixtures'
import { allPreTestMet } from '../support/fit-test-inputs'

let org: FixtureOrganization
let ukOrg: FixtureOrganization
let program: FixtureProgram
let admin: Client
let ukAdmin: Client
let tester: Client
beforeAll(async () => {
  org = await createOrganization('Rules')
  ukOrg = await createOrganization('RulesUK')
  await testDb().update(schema.organizations).set({ ruleSet: 'uk-hse' }).where(eq(schema.organizations.id, ukOrg.id))
  program = await createProgram(org)
  ;[admin, ukAdmin, tester] = await Promise.all([
    signedIn(org.users.admin.email, org.users.admin.password),
    signedIn(ukOrg.users.admin.email, ukOrg.users.admin.password),
    signedIn(org.users.tester.email, org.users.tester.password)
  ])
})
afterAll(closeTestDb)

describe('pass levels an admin may raise, never lower', () => {
  it('shows the rule set\'s levels with their source', async () => {
    const us = await tester.get('/api/pass-levels')
    expect(us.body.ruleSet).toMatchObject({ key: 'us-osha', source: '29 CFR 1910.134(f)(7)' })
    // US: half 100, full 500 — 29 CFR 1910.134(f)(7).
    expect(us.body.categories.map((c: { ruleSetLevel: number }) => c.ruleSetLevel)).toEqual([100, 500])
    // UK: half 100, full 2000 — HSE INDG479 (2019), via secondary summaries.
    const uk = await ukAdmin.get('/api/pass-levels')
    expect(uk.body.categories.map((c: { ruleSetLevel: number }) => c.ruleSetLevel)).toEqual([100, 2000])
  })

  it('refuses a level below the rule set beside its field, and keeps what was saved', async () => {
    expect((await admin.request('PUT', '/api/pass-levels', { byFitCategory: { half: 150 } })).status).toBe(200)
    const low = await admin.request('PUT', '/api/pass-levels', { byFitCategory: { full: 400 }, byRespiratorClass: { 'elastomeric-half-mask': 99 } })
    expect(low.status).toBe(400)
    expect(low.body.data.fieldErrors['byFitCategory.full']).toMatch(/cannot be 400: United States \(OSHA\) requires at least 500 \(29 CFR 1910\.134\(f\)\(7\)\)/)
    expect(low.body.data.fieldErrors['byRespiratorClass.elastomeric-half-mask']).toMatch(/at least 100/)
    const ukLow = await ukAdmin.request('PUT', '/api/pass-levels', { byFitCategory: { full: 1000 } })
    expect(ukLow.body.data.fieldErrors['byFitCategory.full']).toMatch(/at least 2000/)
    const [row] = await testDb().select().from(schema.organizations).where(eq(schema.organizations.id, org.id))
    expect(row!.settings.passLevelOverrides).toEqual({ byFitCategory: { half: 150 }, byRespiratorClass: {} })
  })

  it('refuses loose-fitting classes, unknown classes and non-numbers', async () => {
    const reply = await admin.request('PUT', '/api/pass-levels', { byRespiratorClass: { 'papr-helmet-hood': 200, 'made-up': 200 } })
    expect(reply.status).toBe(400)
    expect(reply.body.data.fieldErrors['byRespiratorClass.papr-helmet-hood']).toMatch(/loose-fitting/)
    expect(reply.body.data.fieldErrors['byRespiratorClass.made-up']).toMatch(/not a known respirator class/)
    for (const body of [{ byFitCategory: { half: '150' } }, { byFitCategory: { half: 1e308 } }, { byFitCategory: { half: 150.5 } }, { byFitCategory: { quarter: 150 } }, 'x', { byFitCategory: { half: null } }]) {
      expect((await admin.request('PUT', '/api/pass-levels', body)).status, JSON.stringify(body)).toBe(400)
    }
  })

  it('applies a raised level to new tests; only an admin may change it', async () => {
    await admin.request('PUT', '/api/pass-levels', { byFitCategory: { half: 150 } })
    const created = await tester.post('/api/fit-tests', { idempotencyKey: randomUUID(), personId: program.personId, respiratorModelId: program.halfMaskId, respiratorSize: 'M', protocolKey: 'osha-standard', counterId: program.counterId, siteId: program.siteId, preTest: allPreTestMet })
    expect(created.body.passLevel).toBe(150)
    expect((await tester.request('PUT', '/api/pass-levels', { byFitCategory: { half: 200 } })).status).toBe(403)
    const wearer = await signedIn(org.users.wearer.email, org.users.wearer.password)
    expect((await wearer.get('/api/pass-levels')).status).toBe(403)
  })
})

describe('custom protocols', () => {
  function custom(overrides: Record<string, unknown> = {}) {
    return {
      key: 'plant-short',
      name: 'Plant short protocol',
      source: 'Program rule 4.2 (invented)',
      ambientPlan: 'per-exercise',
      exercises: [
        { key: 'breathing', name: 'Normal breathing', durationSeconds: 60, counted: true, sampling: { ambientSeconds: 6, purgeSeconds: 4, maskSeconds: 40, closingAmbientSeconds: 0 } },
        { key: 'talking', name: 'Talking', durationSeconds: 60, counted: true, sampling: { ambientSeconds: 6, purgeSeconds: 4, maskSeconds: 30, closingAmbientSeconds: 6 } }
      ],
      ...overrides
    }
  }

  it('adds one checked with the module\'s schema, and a tester can test with it', async () => {
    const added = await admin.post('/api/protocols', custom())
    expect(added.status, JSON.stringify(added.body)).toBe(201)
    const list = await tester.get('/api/protocols')
    expect(list.body.custom.map((p: { key: string }) => p.key)).toEqual(['plant-short'])
    expect(list.body.builtIn.map((p: { key: string }) => p.key)).toContain(STANDARD_PROTOCOL.key)
    const options = await tester.get('/api/fit-test-options')
    expect(options.body.protocols.map((p: { key: string }) => p.key)).toContain('plant-short')
    const test = await tester.post('/api/fit-tests', { idempotencyKey: randomUUID(), personId: program.personId, respiratorModelId: program.halfMaskId, respiratorSize: 'M', protocolKey: 'plant-short', counterId: program.counterId, siteId: program.siteId, preTest: allPreTestMet })
    expect(test.status, JSON.stringify(test.body)).toBe(201)
    expect(test.body.protocol.name).toBe('Plant short protocol')
    expect(test.body.entry.exercises).toHaveLength(2)
  })

  it('says what to fix beside each field', async () => {
    const overlong = await admin.post('/api/protocols', custom({ key: 'overlong', name: 'Overlong', exercises: [{ key: 'a', name: 'A', durationSeconds: 10, counted: true, sampling: { ambientSeconds: 6, purgeSeconds: 4, maskSeconds: 40, closingAmbientSeconds: 0 } }] }))
    expect(overlong.status).toBe(400)
    expect(overlong.body.data.fieldErrors['exercises.0.sampling']).toMatch(/needs 54 s .* lasts 10 s/)
    const builtIn = await admin.post('/api/protocols', custom({ key: STANDARD_PROTOCOL.key, name: 'Mine' }))
    expect(builtIn.body.data.fieldErrors.key).toMatch(/built-in/)
    const again = await admin.post('/api/protocols', custom())
    expect(again.status).toBe(409)
    expect(again.body.data.fieldErrors.key).toBeTruthy()
    const noCounted = await admin.post('/api/protocols', custom({ key: 'none-counted', name: 'None counted', exercises: custom().exercises.map(e => ({ ...e, counted: false })) }))
    expect(noCounted.status).toBe(400)
    expect(noCounted.body.message).toMatch(/At least one exercise must count/)
  })

  it('stops offering one while records keep their copy; only an admin may change them', async () => {
    expect((await tester.post('/api/protocols', custom({ key: 'by-tester', name: 'By tester' }))).status).toBe(403)
    expect((await tester.request('DELETE', '/api/protocols/plant-short')).status).toBe(403)
    expect((await ukAdmin.request('DELETE', '/api/protocols/plant-short')).status).toBe(404)
    expect((await admin.request('DELETE', '/api/protocols/plant-short')).status).toBe(200)
    expect((await admin.request('DELETE', '/api/protocols/plant-short')).status).toBe(404)
    expect((await tester.get('/api/protocols')).body.custom).toEqual([])
  })
})
