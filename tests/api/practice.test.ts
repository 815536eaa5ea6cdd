import { randomUUID } from 'node:crypto'
import { and, eq } from 'drizzle-orm'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import * as schema from '../../server/database/schema'
import { Client, signedIn } from '../support/http'
import { closeTestDb, createOrganization, createProgram, testDb } from '../support/fixtures'
import type { FixtureOrganization } from '../support/fixtures'
import { standardEntry } from '../support/fit-test-inputs'

// Practice people are invented; these names must never surface in any program list or export.
const PRACTICE_NAME = 'Practice Person Quillon'

let org: FixtureOrganization
let other: FixtureOrganization
let trainer: Client
let tester: Client
let reviewer: Client
let wearer: Client
let admin: Client
let outsider: Client

beforeAll(async () => {
  org = await createOrganization('Practice')
  other = await createOrganization('Elsewhere')
  await createProgram(org, { wearerUserId: org.users.wearer.id })
  ;[trainer, tester, reviewer, wearer, admin, outsider] = await Promise.all([
    signedIn(org.users.trainer.email, org.users.trainer.password),
    signedIn(org.users.tester.email, org.users.tester.password),
    signedIn(org.users.reviewer.email, org.users.reviewer.password),
    signedIn(org.users.wearer.email, org.users.wearer.password),
    signedIn(org.users.admin.email, org.users.admin.password),
    signedIn(other.users.trainer.email, other.users.trainer.password)
  ])
})
afterAll(closeTestDb)

async function practiceSet(client: Client, name = 'Tuesday class') {
  const set = await client.post('/api/practice-sets', { name })
  expect(set.status, JSON.stringify(set.body)).toBe(201)
  const person = await client.post('/api/practice-people', { practiceSetId: set.body.id, fullName: PRACTICE_NAME })
  expect(person.status, JSON.stringify(person.body)).toBe(201)
  return { setId: set.body.id as string, personId: person.body.id as string }
}

async function finishedPractice(client: Client, personId: string, fitFactors: number[]) {
  const created = await client.post('/api/practice-tests', { idempotencyKey: randomUUID(), practicePersonId: personId, respiratorClass: 'elastomeric-half-mask', protocolKey: 'osha-standard', sampleFlowCm3PerMin: 350 })
  expect(created.status, JSON.stringify(created.body)).toBe(201)
  const saved = await client.patch(`/api/practice-tests/${created.body.id}`, { version: created.body.version, entry: standardEntry(fitFactors) })
  expect(saved.status, JSON.stringify(saved.body)).toBe(200)
  const finished = await client.post(`/api/practice-tests/${created.body.id}/finish`, { version: saved.body.version })
  expect(finished.status, JSON.stringify(finished.body)).toBe(200)
  return finished.body
}

describe('recording practice', () => {
  it('records a practice test through the same computation as a real one, marked practice', async () => {
    const { personId } = await practiceSet(trainer)
    // [1000×6, 10] → 66.04: DOMAIN.md overall fit factor check (29 CFR 1910.134 App. A Part I.C.2(c), from memory)
    const test = await finishedPractice(trainer, personId, [1000, 1000, 1000, 1000, 1000, 1000, 10])
    expect(test.practice).toBe(true)
    expect(test.status).toBe('finished')
    // half-mask pass level 100 — 29 CFR 1910.134(f)(7)
    expect(test.passLevel).toBe(100)
    expect(test.result.overall.value).toBeCloseTo(66.04, 2)
    expect(test.passed).toBe(false)
    expect(test.person.fullName).toBe(PRACTICE_NAME)
  })

  it('lets a tester in training record one, and refuses to finish an incomplete test', async () => {
    const { personId } = await practiceSet(tester, 'Tester practice')
    const created = await tester.post('/api/practice-tests', { idempotencyKey: randomUUID(), practicePersonId: personId, respiratorClass: 'elastomeric-half-mask', protocolKey: 'osha-standard', sampleFlowCm3PerMin: 350 })
    expect(created.status).toBe(201)
    const finish = await tester.post(`/api/practice-tests/${created.body.id}/finish`, { version: created.body.version })
    expect(finish.status).toBe(409)
    expect(finish.body.message).toMatch(/cannot be finished yet/)
  })

  it('refuses a stale version and keeps the saved draft', async () => {
    const { personId } = await practiceSet(trainer)
    const created = await trainer.post('/api/practice-tests', { idempotencyKey: randomUUID(), practicePersonId: personId, respiratorClass: 'elastomeric-half-mask', protocolKey: 'osha-standard', sampleFlowCm3PerMin: 100 })
    const first = await trainer.patch(`/api/practice-tests/${created.body.id}`, { version: 1, entry: standardEntry([200, 200, 200, 200, 200, 200, 200]) })
    expect(first.status).toBe(200)
    const stale = await trainer.patch(`/api/practice-tests/${created.body.id}`, { version: 1, entry: standardEntry([5, 5, 5, 5, 5, 5, 5]) })
    expect(stale.status).toBe(409)
    const now = await trainer.get(`/api/practice-tests/${created.body.id}`)
    expect(now.body.result.overall.value).toBeCloseTo(200, 6)
  })
})

describe('practice never reaches the program', () => {
  it('is absent from fit-test lists, people, the CSV export, the overview and the wearer\'s status', async () => {
    const { personId } = await practiceSet(trainer, 'Invisible class')
    const test = await finishedPractice(trainer, personId, [500, 500, 500, 500, 500, 500, 500])
    for (const client of [tester, reviewer, admin]) {
      const list = await client.get('/api/fit-tests?pageSize=200')
      expect(list.status).toBe(200)
      expect(JSON.stringify(list.body)).not.toContain(PRACTICE_NAME)
      expect(JSON.stringify(list.body)).not.toContain(test.id)
      const people = await client.get('/api/people')
      expect(JSON.stringify(people.body)).not.toContain(PRACTICE_NAME)
    }
    const csv = await reviewer.fetch('GET', '/api/exports/fit-tests.csv')
    expect(csv.status).toBe(200)
    expect(await csv.text()).not.toContain(PRACTICE_NAME)
    const overview = await admin.get('/api/overview')
    expect(JSON.stringify(overview.body)).not.toContain(PRACTICE_NAME)
    const status = await wearer.get('/api/me/fit-status')
    expect(JSON.stringify(status.body)).not.toContain(PRACTICE_NAME)
    // the fit_tests and people tables hold nothing of it
    expect(await testDb().select().from(schema.fitTests).where(eq(schema.fitTests.organizationId, org.id))).toHaveLength(0)
    const people = await testDb().select().from(schema.people).where(and(eq(schema.people.organizationId, org.id), eq(schema.people.fullName, PRACTICE_NAME)))
    expect(people).toHaveLength(0)
  })

  it('cannot be reached through the fit-test routes, so it can never get a card', async () => {
    const { personId } = await practiceSet(trainer)
    const test = await finishedPractice(trainer, personId, [300, 300, 300, 300, 300, 300, 300])
    for (const path of [`/api/fit-tests/${test.id}`, `/api/fit-tests/${test.id}/card`]) {
      expect((await tester.get(path)).status).toBe(404)
    }
    const cards = await testDb().select().from(schema.fitCards).where(eq(schema.fitCards.recordId, test.id))
    expect(cards).toHaveLength(0)
  })
})

describe('clearing a practice set', () => {
  it('removes its people and tests in one audited action, for a trainer only', async () => {
    const { setId, personId } = await practiceSet(trainer, 'To be cleared')
    const test = await finishedPractice(trainer, personId, [150, 150, 150, 150, 150, 150, 150])
    expect((await tester.request('DELETE', `/api/practice-sets/${setId}`)).status).toBe(403)
    const cleared = await trainer.request('DELETE', `/api/practice-sets/${setId}`)
    expect(cleared.status).toBe(200)
    expect(cleared.body.cleared).toEqual({ name: 'To be cleared', practicePeople: 1, practiceTests: 1 })
    expect((await trainer.get(`/api/practice-tests/${test.id}`)).status).toBe(404)
    expect((await trainer.get(`/api/practice-sets/${setId}`)).status).toBe(404)
    const trail = await testDb().select().from(schema.auditEvents).where(and(eq(schema.auditEvents.organizationId, org.id), eq(schema.auditEvents.entityId, setId), eq(schema.auditEvents.action, 'cleared')))
    expect(trail).toHaveLength(1)
    expect(trail[0]!.actorUserId).toBe(org.users.trainer.id)
  })
})

describe('roles and tenancy', () => {
  it('admits trainers, testers and admins; reviewers read; wearers and strangers are kept out', async () => {
    const { setId } = await practiceSet(admin, 'Admin class')
    expect((await reviewer.get(`/api/practice-sets/${setId}`)).status).toBe(200)
    expect((await reviewer.post('/api/practice-sets', { name: 'Nope' })).status).toBe(403)
    expect((await wearer.get('/api/practice-sets')).status).toBe(403)
    expect((await wearer.post('/api/practice-sets', { name: 'Nope' })).status).toBe(403)
    expect((await new Client().get('/api/practice-sets')).status).toBe(401)
    // another organization's trainer: not found, as if it did not exist
    expect((await outsider.get(`/api/practice-sets/${setId}`)).status).toBe(404)
    expect((await outsider.request('DELETE', `/api/practice-sets/${setId}`)).status).toBe(404)
    expect((await outsider.post('/api/practice-people', { practiceSetId: setId, fullName: 'Intruder' })).status).toBe(404)
    const list = await outsider.get('/api/practice-sets')
    expect(JSON.stringify(list.body)).not.toContain('Admin class')
  })

  it.each([
    { body: { name: 'a\u0000b' }, why: 'NUL character' },
    { body: { name: 42 }, why: 'wrong type' },
    { body: { name: 'x'.repeat(500) }, why: 'too long' },
    { body: null, why: 'no body' }
  ])('refuses a hostile set body with 400 ($why)', async ({ body }) => {
    const reply = await trainer.post('/api/practice-sets', body)
    expect(reply.status).toBe(400)
  })

  it('refuses hostile test bodies with a 4xx, never a 5xx', async () => {
    const { personId } = await practiceSet(trainer)
    const base = { idempotencyKey: randomUUID(), practicePersonId: personId, respiratorClass: 'elastomeric-half-mask', protocolKey: 'osha-standard', sampleFlowCm3PerMin: 350 }
    for (const body of [{ ...base, sampleFlowCm3PerMin: 1e308 }, { ...base, sampleFlowCm3PerMin: -1 }, { ...base, idempotencyKey: 'abc\u0000defgh' }, { ...base, respiratorClass: 'loose-fitting-hood' }, { ...base, practicePersonId: 'nope' }]) {
      const reply = await trainer.post('/api/practice-tests', body)
      expect(reply.status, JSON.stringify(body)).toBe(400)
      expect(reply.body.data?.fieldErrors).toBeTruthy()
    }
    const created = await trainer.post('/api/practice-tests', base)
    const bad = await trainer.patch(`/api/practice-tests/${created.body.id}`, { version: 1, entry: { mode: 'grid', exercises: [{ exerciseKey: 'x\u0000', inMask: 1 }] } })
    expect(bad.status).toBe(400)
    const nul = await trainer.patch(`/api/practice-tests/${created.body.id}`, { version: 1, seriesText: '0,ambient,1\u0000' })
    expect(nul.status).toBe(400)
  })
})
