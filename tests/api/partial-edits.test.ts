import { randomUUID } from 'node:crypto'
import { eq } from 'drizzle-orm'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import * as schema from '../../server/database/schema'
import { signedIn } from '../support/http'
import type { Client } from '../support/http'
import { closeTestDb, createOrganization, createProgram, testDb } from '../support/fixtures'
import type { FixtureOrganization, FixtureProgram } from '../support/fixtures'
import { allPreTestMet, standardEntry } from '../support/fit-test-inputs'

// A partial edit (PATCH) changes exactly the fields it sends: every other field of the row must
// read back as it was. One test per route; the people route is tested with the roster.

let org: FixtureOrganization
let program: FixtureProgram
let admin: Client
let tester: Client

beforeAll(async () => {
  org = await createOrganization('Partial')
  program = await createProgram(org)
  ;[admin, tester] = await Promise.all([
    signedIn(org.users.admin.email, org.users.admin.password),
    signedIn(org.users.tester.email, org.users.tester.password)
  ])
})
afterAll(closeTestDb)

describe('each PATCH route keeps the fields it was not sent', () => {
  it('counters: retiring keeps description, calibration date and site', async () => {
    const created = await tester.post('/api/counters', { serialNumber: `PE-C-${randomUUID().slice(0, 6)}`, description: 'Bench counter, room 2', sampleFlowCm3PerMin: 350, calibrationDueOn: '2027-03-31', siteId: program.siteId })
    expect(created.status).toBe(201)
    const reply = await tester.patch(`/api/counters/${created.body.id}`, { active: false })
    expect(reply.status).toBe(200)
    const after = (await tester.get(`/api/counters/${created.body.id}`)).body
    expect(after).toMatchObject({ active: false, description: 'Bench counter, room 2', sampleFlowCm3PerMin: 350, calibrationDueOn: '2027-03-31', siteId: program.siteId, serialNumber: created.body.serialNumber })
  })

  it('bench rigs: a new description keeps the site, the paired counter and the active flag', async () => {
    const rig = await tester.post('/api/bench-rigs', { serialNumber: `PE-R-${randomUUID().slice(0, 6)}`, description: 'Hood A', counterId: program.counterId, siteId: program.siteId })
    expect(rig.status).toBe(201)
    expect((await tester.patch(`/api/bench-rigs/${rig.body.id}`, { description: 'Hood A, resealed' })).status).toBe(200)
    const after = (await tester.get(`/api/bench-rigs/${rig.body.id}`)).body
    expect(after).toMatchObject({ description: 'Hood A, resealed', siteId: program.siteId, counterId: program.counterId, active: true })
  })

  it('mask types: a new name keeps the drink-tube and valve flags, the pass level and the interval', async () => {
    const type = await tester.post('/api/mask-types', { name: `PE type ${randomUUID().slice(0, 6)}`, hasDrinkTube: true, hasExhalationValve: true, headformPassLevel: 3000, headformRetestDays: 90 })
    expect(type.status).toBe(201)
    const reply = await tester.patch(`/api/mask-types/${type.body.id}`, { name: `${type.body.name} (renamed)` })
    expect(reply.status).toBe(200)
    expect(reply.body).toMatchObject({ hasDrinkTube: true, hasExhalationValve: true, headformPassLevel: 3000, headformRetestDays: 90 })
  })

  it('mask units: a new size keeps the site, type, model and serial', async () => {
    const type = await tester.post('/api/mask-types', { name: `PE unit type ${randomUUID().slice(0, 6)}`, headformRetestDays: 180 })
    const unit = await tester.post('/api/mask-units', { serialNumber: `PE-U-${randomUUID().slice(0, 6)}`, respiratorModelId: program.fullFacepieceId, maskTypeId: type.body.id, size: 'M', siteId: program.siteId })
    expect(unit.status).toBe(201)
    const reply = await tester.patch(`/api/mask-units/${unit.body.id}`, { size: 'L' })
    expect(reply.status).toBe(200)
    expect(reply.body).toMatchObject({ size: 'L', siteId: program.siteId, maskTypeId: type.body.id, respiratorModelId: program.fullFacepieceId, serialNumber: unit.body.serialNumber, state: 'in-service' })
  })

  it('respirator models: retiring keeps the sizes and notes', async () => {
    const model = await admin.post('/api/respirator-models', { make: 'Partial Safety', model: `PS-${randomUUID().slice(0, 6)}`, respiratorClass: 'elastomeric-half-mask', sizes: ['S', 'M'], notes: 'Silicone seal' })
    expect(model.status).toBe(201)
    expect((await admin.patch(`/api/respirator-models/${model.body.id}`, { active: false })).status).toBe(200)
    const [row] = await testDb().select().from(schema.respiratorModels).where(eq(schema.respiratorModels.id, model.body.id))
    expect(row).toMatchObject({ active: false, sizes: ['S', 'M'], notes: 'Silicone seal', respiratorClass: 'elastomeric-half-mask' })
  })

  it('readiness templates: a new name keeps the steps', async () => {
    const step = { name: 'Zero', instruction: 'Fit the zero filter and read the counter', rule: { kind: 'at-most', max: 1, unit: 'particles/cm³' } }
    const created = await admin.post('/api/readiness-templates', { name: 'Partial check', scope: 'counter', steps: [step] })
    expect(created.status).toBe(201)
    expect((await admin.patch(`/api/readiness-templates/${created.body.id}`, { name: 'Partial check, renamed' })).status).toBe(200)
    const after = (await admin.get(`/api/readiness-templates/${created.body.id}`)).body
    expect(after).toMatchObject({ name: 'Partial check, renamed', scope: 'counter', active: true })
    expect(after.steps).toEqual([{ ...step, requiresPart: null }])
  })

  it('users: a new display name keeps the role and active flag', async () => {
    const reply = await admin.patch(`/api/users/${org.users.reviewer.id}`, { displayName: 'Reviewer, renamed' })
    expect(reply.status).toBe(200)
    expect(reply.body).toMatchObject({ displayName: 'Reviewer, renamed', role: 'reviewer', active: true })
  })

  it('fit-test drafts: one pre-test item and the entry mode leave the other items and the grid alone', async () => {
    const created = await tester.post('/api/fit-tests', {
      idempotencyKey: randomUUID(), personId: program.personId, respiratorModelId: program.halfMaskId, respiratorSize: 'M',
      protocolKey: 'osha-standard', counterId: program.counterId, siteId: program.siteId, performedAt: '2026-11-20T15:00:00Z',
      preTest: allPreTestMet, entry: standardEntry([500, 500, 500, 500, 500, 500, 500])
    })
    expect(created.status).toBe(201)
    const reply = await tester.patch(`/api/fit-tests/${created.body.id}`, { version: created.body.version, preTest: { comfortAcceptable: false } })
    expect(reply.status).toBe(200)
    expect(reply.body.preTest).toEqual({ ...allPreTestMet, comfortAcceptable: false })
    expect(reply.body.respiratorSize).toBe('M')
    // Seven counted exercises at 500 each: the harmonic mean is 500 (29 CFR 1910.134 App. A Part I.C.2(c), derived).
    expect(reply.body.overallFitFactor).toBeCloseTo(500, 6)
    expect(reply.body.entry.exercises.filter((e: { inMask: number | null }) => e.inMask !== null)).toHaveLength(7)
  })

  it('refuses an empty edit with a sentence, and never answers 5xx', async () => {
    const created = await tester.post('/api/counters', { serialNumber: `PE-C-${randomUUID().slice(0, 6)}`, sampleFlowCm3PerMin: 100 })
    const reply = await tester.patch(`/api/counters/${created.body.id}`, {})
    expect(reply.status).toBe(400)
    expect(reply.body.message).toMatch(/Nothing to change/)
  })
})
