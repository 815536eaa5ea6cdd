import { and, eq } from 'drizzle-orm'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { signedIn } from '../support/http'
import type { Client } from '../support/http'
import { closeTestDb, createOrganization, testDb } from '../support/fixtures'
import type { FixtureOrganization } from '../support/fixtures'
import * as schema from '../../server/database/schema'

let a: FixtureOrganization
let b: FixtureOrganization
let admin: Client
let tester: Client
let reviewer: Client
let trainer: Client
let wearer: Client
let otherAdmin: Client
let modelId: string
let cbrnTypeId: string
let simpleTypeId: string
let rigId: string
let rigTemplateId: string

async function newUnit(serialNumber: string, maskTypeId = cbrnTypeId) {
  const reply = await tester.post('/api/mask-units', { serialNumber, respiratorModelId: modelId, maskTypeId, size: 'M' })
  expect(reply.status).toBe(201)
  return reply.body as { id: string, state: string }
}

/** Runs the rig's readiness check to the end with passing values. */
async function passRigCheck(maskTypeId?: string) {
  const started = await tester.post('/api/readiness-checks', { templateId: rigTemplateId, benchRigId: rigId, maskTypeId })
  let check = started.body
  while (check.status === 'in-progress') {
    const rule = check.steps[check.currentStep].rule
    const value = rule.kind === 'pass-fail' ? true : rule.kind === 'at-most' ? rule.max : rule.min
    check = (await tester.post(`/api/readiness-checks/${check.id}/steps`, { stepIndex: check.currentStep, value })).body
  }
  expect(check.status).toBe('passed')
  return check
}

const cbrnSubChecks = { 'harness-and-buckles': true, 'lens-and-seal-face': true, 'valve-cover-seat': true, 'drink-tube-cap': true }

beforeAll(async () => {
  [a, b] = await Promise.all([createOrganization('Harbour'), createOrganization('Moor')])
  ;[admin, tester, reviewer, trainer, wearer, otherAdmin] = await Promise.all([
    signedIn(a.users.admin.email, a.users.admin.password),
    signedIn(a.users.tester.email, a.users.tester.password),
    signedIn(a.users.reviewer.email, a.users.reviewer.password),
    signedIn(a.users.trainer.email, a.users.trainer.password),
    signedIn(a.users.wearer.email, a.users.wearer.password),
    signedIn(b.users.admin.email, b.users.admin.password)
  ])
  // The catalogue's admin screens belong elsewhere; an invented model goes straight into the table.
  const [model] = await testDb().insert(schema.respiratorModels).values({ organizationId: a.id, make: 'Fixture Optics', model: 'FO-9 full facepiece', respiratorClass: 'elastomeric-full-facepiece', sizes: ['S', 'M', 'L'] }).returning()
  modelId = model!.id
  cbrnTypeId = (await tester.post('/api/mask-types', { name: 'Fixture CBRN facepiece', hasDrinkTube: true, hasExhalationValve: true, headformPassLevel: null, headformRetestDays: 180 })).body.id
  simpleTypeId = (await tester.post('/api/mask-types', { name: 'Fixture plain facepiece', headformPassLevel: 500, headformRetestDays: 365 })).body.id
  const counter = await tester.post('/api/counters', { serialNumber: 'HB-C-1', sampleFlowCm3PerMin: 350, calibrationDueOn: '2099-01-01' })
  rigId = (await tester.post('/api/bench-rigs', { serialNumber: 'HB-R-1', counterId: counter.body.id })).body.id
  const templates = await tester.get('/api/readiness-templates')
  rigTemplateId = templates.body.find((t: { scope: string }) => t.scope === 'bench-rig').id
})
afterAll(closeTestDb)

describe('mask types and units', () => {
  it('refuses a mask type with no name or an impossible interval', async () => {
    const reply = await tester.post('/api/mask-types', { name: '', headformRetestDays: 0 })
    expect(reply.status).toBe(400)
    expect(reply.body.data.fieldErrors).toMatchObject({ name: expect.stringMatching(/Enter a name/), headformRetestDays: expect.stringMatching(/at least 1 day/) })
  })

  it('registers a unit in service, due for its first headform test now', async () => {
    const unit = await newUnit('HB-0001')
    const reply = await reviewer.get(`/api/mask-units/${unit.id}`)
    expect(reply.body).toMatchObject({ state: 'in-service', make: 'Fixture Optics', size: 'M', headformDueOn: new Date().toISOString().slice(0, 10) })
    expect(reply.body.events).toHaveLength(1)
  })

  it('holds and returns a unit with a reason kept in its history; a retired unit stays retired', async () => {
    const unit = await newUnit('HB-0002')
    expect((await tester.post(`/api/mask-units/${unit.id}/state`, { state: 'held', reason: '' })).status).toBe(400)
    expect((await tester.post(`/api/mask-units/${unit.id}/state`, { state: 'held', reason: 'Strap frayed' })).body.state).toBe('held')
    // A held unit needs a passing headform test after the hold: 24,000 / 4 = 6,000 ≥ 2,000 (derived; default level from memory).
    await tester.post('/api/headform-tests', { maskUnitId: unit.id, benchRigId: rigId, outside: 24000, inside: 4, sampleSeconds: 60, subChecks: cbrnSubChecks })
    expect((await tester.post(`/api/mask-units/${unit.id}/state`, { state: 'in-service', reason: 'Strap replaced' })).status).toBe(200)
    await tester.post(`/api/mask-units/${unit.id}/state`, { state: 'retired', reason: 'Lens scratched beyond repair' })
    const detail = await reviewer.get(`/api/mask-units/${unit.id}`)
    expect(detail.body.events.map((e: { reason: string }) => e.reason)).toEqual(['Lens scratched beyond repair', 'Strap replaced', 'Strap frayed', 'Added to the register'])
    const back = await tester.post(`/api/mask-units/${unit.id}/state`, { state: 'in-service', reason: 'oops' })
    expect(back.status).toBe(409)
  })

  it('refuses a duplicate serial beside the field', async () => {
    await newUnit('HB-0003')
    const reply = await tester.post('/api/mask-units', { serialNumber: 'HB-0003', respiratorModelId: modelId, maskTypeId: cbrnTypeId, size: 'L' })
    expect(reply.status).toBe(409)
    expect(reply.body.data.fieldErrors.serialNumber).toBeTruthy()
  })
})

describe('headform tests', () => {
  it('recomputes the bench protection factor, ignoring numbers the client sends, and flags an uncovered result', async () => {
    const unit = await newUnit('HB-0010')
    const reply = await tester.post('/api/headform-tests', {
      maskUnitId: unit.id, benchRigId: rigId, outside: 25000, inside: 20, sampleSeconds: 60, subChecks: cbrnSubChecks,
      benchProtectionFactor: 99999, passed: true
    })
    expect(reply.status).toBe(201)
    // 25,000 / 20 = 1,250 (derived: outside / inside, DOMAIN.md "Bench protection factor"),
    // below the default 2,000 (NIOSH CBRN laboratory protection level, from memory).
    expect(reply.body.result.benchProtectionFactor.factor.value).toBeCloseTo(1250, 6)
    expect(reply.body.passLevel).toBe(2000)
    expect(reply.body.passLevelLabel).toMatch(/NIOSH CBRN laboratory protection level \(from memory\)/)
    expect(reply.body.result.passed).toBe(false)
    expect(reply.body.coverage).toMatchObject({ covered: false, reason: 'no-check-that-day' })
  })

  it('is covered after a passing check of the rig earlier the same day', async () => {
    await passRigCheck()
    const unit = await newUnit('HB-0011')
    const reply = await tester.post('/api/headform-tests', { maskUnitId: unit.id, benchRigId: rigId, outside: 24000, inside: 4, sampleSeconds: 60, subChecks: cbrnSubChecks })
    // 24,000 / 4 = 6,000 ≥ 2,000 (derived; default level from memory).
    expect(reply.body.result).toMatchObject({ passed: true })
    expect(reply.body.coverage).toMatchObject({ covered: true, reason: 'covered' })
  })

  it('asks for every sub-check of the mask type, and only those', async () => {
    const unit = await newUnit('HB-0012')
    const missing = await tester.post('/api/headform-tests', { maskUnitId: unit.id, benchRigId: rigId, outside: 24000, inside: 4, sampleSeconds: 60, subChecks: { 'harness-and-buckles': true } })
    expect(missing.status).toBe(400)
    expect(missing.body.data.fieldErrors['subChecks.drink-tube-cap']).toMatch(/pass or fail/)
    const plain = await newUnit('HB-0013', simpleTypeId)
    const ok = await tester.post('/api/headform-tests', { maskUnitId: plain.id, benchRigId: rigId, outside: 24000, inside: 40, sampleSeconds: 60, subChecks: { 'harness-and-buckles': true, 'lens-and-seal-face': true } })
    expect(ok.status).toBe(201)
    // 24,000 / 40 = 600 ≥ 500, the program's own level for this type (derived).
    expect(ok.body).toMatchObject({ passLevel: 500, result: { passed: true } })
    expect(ok.body.result.subChecks.map((c: { key: string }) => c.key)).toEqual(['harness-and-buckles', 'lens-and-seal-face'])
  })

  it('refuses an uncovered result with the reason when the program says so', async () => {
    const unit = await newUnit('HB-0014')
    expect((await admin.patch('/api/settings', { uncoveredResults: 'refuse' })).body.uncoveredResults).toBe('refuse')
    // A passing rig check exists today, so the refusal comes from the past-due calibration.
    const counters = and(eq(schema.counters.organizationId, a.id), eq(schema.counters.serialNumber, 'HB-C-1'))
    await testDb().update(schema.counters).set({ calibrationDueOn: '2000-01-01' }).where(counters)
    const reply = await tester.post('/api/headform-tests', { maskUnitId: unit.id, benchRigId: rigId, outside: 24000, inside: 4, sampleSeconds: 60, subChecks: cbrnSubChecks })
    expect(reply.status).toBe(409)
    expect(reply.body.message).toMatch(/Not saved: .*calibration/)
    await testDb().update(schema.counters).set({ calibrationDueOn: '2099-01-01' }).where(counters)
    await admin.patch('/api/settings', { uncoveredResults: 'flag' })
  })

  it('skips the drink-tube and valve steps of a rig check for a simpler mask type', async () => {
    const check = await passRigCheck(simpleTypeId)
    const skippedNames = check.skippedSteps.map((i: number) => check.steps[i].name)
    expect(skippedNames).toEqual(expect.arrayContaining([expect.stringMatching(/Drink-tube/), expect.stringMatching(/Exhalation-valve/)]))
    const recorded = new Set(check.entries.map((e: { stepIndex: number }) => e.stepIndex))
    for (const i of check.skippedSteps) expect(recorded.has(i)).toBe(false)
  })
})

describe('roles and organizations', () => {
  it('lets reviewers and trainers read units but not change them; a wearer gets nothing', async () => {
    const unit = await newUnit('HB-0020')
    for (const client of [reviewer, trainer]) {
      expect((await client.get(`/api/mask-units/${unit.id}`)).status).toBe(200)
      expect((await client.post(`/api/mask-units/${unit.id}/state`, { state: 'held', reason: 'no' })).status).toBe(403)
      expect((await client.post('/api/headform-tests', { maskUnitId: unit.id, benchRigId: rigId, outside: 1, inside: 1, sampleSeconds: 1 })).status).toBe(403)
      expect((await client.post('/api/mask-types', { name: 'X', headformRetestDays: 10 })).status).toBe(403)
      expect((await client.patch('/api/settings', { uncoveredResults: 'refuse' })).status).toBe(403)
    }
    for (const path of ['/api/mask-units', `/api/mask-units/${unit.id}`, '/api/mask-types', '/api/headform-tests', '/api/settings']) {
      expect((await wearer.get(path)).status, path).toBe(403)
    }
  })

  it('answers 404 for another organization\'s units and refuses its rig in a test', async () => {
    const unit = await newUnit('HB-0021')
    expect((await otherAdmin.get(`/api/mask-units/${unit.id}`)).status).toBe(404)
    expect((await otherAdmin.patch(`/api/mask-units/${unit.id}`, { size: 'S' })).status).toBe(404)
    expect((await otherAdmin.post(`/api/mask-units/${unit.id}/state`, { state: 'held', reason: 'not ours' })).status).toBe(404)
    expect((await otherAdmin.post('/api/headform-tests', { maskUnitId: unit.id, benchRigId: rigId, outside: 1, inside: 1, sampleSeconds: 1 })).status).toBe(404)
    const list = await otherAdmin.get('/api/mask-units')
    expect(list.body).toEqual([])
    expect((await otherAdmin.patch(`/api/mask-types/${cbrnTypeId}`, { name: 'Taken' })).status).toBe(404)
  })
})
