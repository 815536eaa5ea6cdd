import { randomUUID } from 'node:crypto'
import { and, eq } from 'drizzle-orm'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import * as schema from '../../server/database/schema'
import { signedIn } from '../support/http'
import type { Client } from '../support/http'
import { closeTestDb, createOrganization, createProgram, testDb } from '../support/fixtures'
import type { FixtureOrganization, FixtureProgram } from '../support/fixtures'
import { allPreTestMet, standardEntry } from '../support/fit-test-inputs'

// Mask units stay under control (issue 8, item 4). Bench protection factor = outside / inside
// (DOMAIN.md "Bench protection factor"); the mask type's own pass level of 500 is a program
// setting (no public value).

let org: FixtureOrganization
let program: FixtureProgram
let admin: Client
let tester: Client
let typeId: string
let rigId: string

const DAY_MS = 86_400_000
const today = () => new Date().toISOString().slice(0, 10)
const plainChecks = { 'harness-and-buckles': true, 'lens-and-seal-face': true }

async function newUnit(size = 'M') {
  const reply = await tester.post('/api/mask-units', { serialNumber: `MC-${randomUUID().slice(0, 8)}`, respiratorModelId: program.fullFacepieceId, maskTypeId: typeId, size })
  expect(reply.status, JSON.stringify(reply.body)).toBe(201)
  return reply.body as { id: string, serialNumber: string }
}

/** 24,000 / 8 = 3,000 ≥ 500 passes; 24,000 / 80 = 300 < 500 fails (derived). */
async function headformTest(unitId: string, passes: boolean, notes = '') {
  const reply = await tester.post('/api/headform-tests', { maskUnitId: unitId, benchRigId: rigId, outside: 24000, inside: passes ? 8 : 80, sampleSeconds: 60, subChecks: plainChecks, notes })
  expect(reply.status, JSON.stringify(reply.body)).toBe(201)
  expect(reply.body.result.passed).toBe(passes)
  return reply.body
}

const setState = (client: Client, unitId: string, state: string, reason: string, extra: Record<string, unknown> = {}) =>
  client.post(`/api/mask-units/${unitId}/state`, { state, reason, ...extra })

beforeAll(async () => {
  org = await createOrganization('MaskControl')
  program = await createProgram(org)
  ;[admin, tester] = await Promise.all([
    signedIn(org.users.admin.email, org.users.admin.password),
    signedIn(org.users.tester.email, org.users.tester.password)
  ])
  typeId = (await tester.post('/api/mask-types', { name: 'Control plain facepiece', headformPassLevel: 500, headformRetestDays: 180 })).body.id
  rigId = (await tester.post('/api/bench-rigs', { serialNumber: `MC-R-${randomUUID().slice(0, 6)}`, counterId: program.counterId })).body.id
})
afterAll(closeTestDb)

describe('a held unit', () => {
  it('returns to service only after a passing headform test recorded after the hold', async () => {
    const unit = await newUnit()
    await headformTest(unit.id, true)
    expect((await setState(tester, unit.id, 'held', 'Strap frayed')).status).toBe(200)
    // The pass before the hold does not count.
    const refused = await setState(tester, unit.id, 'in-service', 'Strap replaced')
    expect(refused.status).toBe(409)
    expect(refused.body.message).toMatch(/passing headform test recorded after the hold/)
    await headformTest(unit.id, false)
    expect((await setState(tester, unit.id, 'in-service', 'Strap replaced')).status).toBe(409)
    const pass = await headformTest(unit.id, true)
    const back = await setState(tester, unit.id, 'in-service', 'Strap replaced and retested')
    expect(back.status).toBe(200)
    expect(back.body.state).toBe('in-service')
    const [event] = await testDb().select().from(schema.maskUnitEvents)
      .where(and(eq(schema.maskUnitEvents.maskUnitId, unit.id), eq(schema.maskUnitEvents.toState, 'in-service'), eq(schema.maskUnitEvents.reason, 'Strap replaced and retested')))
    expect(event).toMatchObject({ headformTestId: pass.id, override: false })
  })

  it('may be returned by a program admin override with a reason, audited and shown; a tester may not override', async () => {
    const unit = await newUnit()
    await setState(tester, unit.id, 'held', 'Dropped on concrete')
    const byTester = await setState(tester, unit.id, 'in-service', 'No time to test', { override: true })
    expect(byTester.status).toBe(403)
    expect((await setState(admin, unit.id, 'in-service', '', { override: true })).status).toBe(400)
    const byAdmin = await setState(admin, unit.id, 'in-service', 'Inspected by the program admin; bench rig out for repair', { override: true })
    expect(byAdmin.status).toBe(200)
    const detail = await tester.get(`/api/mask-units/${unit.id}`)
    expect(detail.body.events[0]).toMatchObject({ toState: 'in-service', override: true, reason: 'Inspected by the program admin; bench rig out for repair' })
    const audit = await testDb().select().from(schema.auditEvents).where(and(eq(schema.auditEvents.entityId, unit.id), eq(schema.auditEvents.action, 'state-in-service-override')))
    expect(audit).toHaveLength(1)
  })
})

describe('retired is final', () => {
  it('ends retired when 30 retire / in-service pairs arrive at the same moment', async () => {
    const units = []
    for (let i = 0; i < 30; i++) {
      const unit = await newUnit()
      await setState(tester, unit.id, 'held', 'Held for inspection')
      await headformTest(unit.id, true)
      units.push(unit)
    }
    const other = await signedIn(org.users.tester.email, org.users.tester.password)
    const replies = await Promise.all(units.flatMap(u => [
      setState(tester, u.id, 'retired', 'Lens crazed'),
      setState(other, u.id, 'in-service', 'Passed its retest')
    ]))
    expect(replies.every(r => r.status === 200 || r.status === 409)).toBe(true)
    const rows = await testDb().select({ id: schema.maskUnits.id, state: schema.maskUnits.state }).from(schema.maskUnits)
      .where(eq(schema.maskUnits.organizationId, org.id))
    const states = rows.filter(r => units.some(u => u.id === r.id)).map(r => r.state)
    expect(states).toHaveLength(30)
    expect(states.every(s => s === 'retired')).toBe(true)
  })
})

describe('the retest interval', () => {
  it('runs from a passing test: a failed test leaves the unit due', async () => {
    const unit = await newUnit()
    // A pass 200 days ago with a 180-day interval: due 20 days ago.
    const old = new Date(Date.now() - 200 * DAY_MS)
    await testDb().insert(schema.headformTests).values({
      organizationId: org.id, maskUnitId: unit.id, benchRigId: rigId, counterId: program.counterId, performedAt: old,
      outside: 24000, inside: 8, sampleSeconds: 60, sampleFlowCm3PerMin: 100, passLevel: 500, passLevelIsDefault: false, subChecks: plainChecks, passed: true
    })
    const dueBefore = new Date(old.getTime() + 180 * DAY_MS).toISOString().slice(0, 10)
    expect((await tester.get(`/api/mask-units/${unit.id}`)).body.headformDueOn).toBe(dueBefore)
    await headformTest(unit.id, false, 'Valve flutter heard at the exhalation port')
    const after = await tester.get(`/api/mask-units/${unit.id}`)
    expect(after.body.headformDueOn).toBe(dueBefore)
    expect(after.body.headformTests[0].notes).toBe('Valve flutter heard at the exhalation port')
    await headformTest(unit.id, true)
    expect((await tester.get(`/api/mask-units/${unit.id}`)).body.headformDueOn).toBe(new Date(Date.now() + 180 * DAY_MS).toISOString().slice(0, 10))
  })

  it('keeps a never-passed unit due today after a failed first test', async () => {
    const unit = await newUnit()
    await headformTest(unit.id, false)
    expect((await tester.get(`/api/mask-units/${unit.id}`)).body.headformDueOn).toBe(today())
  })
})

describe('a fit test with a tracked model', () => {
  const body = (over: Record<string, unknown>) => ({
    idempotencyKey: randomUUID(), personId: program.personId, respiratorModelId: program.fullFacepieceId, respiratorSize: 'M',
    protocolKey: 'osha-standard', counterId: program.counterId, siteId: program.siteId, preTest: allPreTestMet,
    entry: standardEntry([900, 900, 900, 900, 900, 900, 900]), ...over
  })

  it('names the unit worn and refuses a held or retired one', async () => {
    const missing = await tester.post('/api/fit-tests', body({}))
    expect(missing.status).toBe(400)
    expect(missing.body.data.fieldErrors.maskUnitId).toMatch(/tracked by serial number/)

    const held = await newUnit()
    await setState(tester, held.id, 'held', 'Awaiting a new valve')
    const refused = await tester.post('/api/fit-tests', body({ maskUnitId: held.id }))
    expect(refused.status).toBe(400)
    expect(refused.body.data.fieldErrors.maskUnitId).toMatch(/is held/)

    const wrongSize = await newUnit('L')
    expect((await tester.post('/api/fit-tests', body({ maskUnitId: wrongSize.id }))).body.data.fieldErrors.maskUnitId).toMatch(/size L/)

    const good = await newUnit()
    const created = await tester.post('/api/fit-tests', body({ maskUnitId: good.id }))
    expect(created.status).toBe(201)
    expect(created.body.maskUnit).toMatchObject({ id: good.id, serialNumber: good.serialNumber })

    // Held after the draft was started: the test cannot be finished with it.
    await setState(tester, good.id, 'held', 'Cracked lens found during the test')
    const finish = await tester.post(`/api/fit-tests/${created.body.id}/finish`, { version: created.body.version })
    expect(finish.status).toBe(409)
    expect(finish.body.message).toMatch(/is held/)
  })

  it('lets a correction of a past test finish although its unit has been held since', async () => {
    const unit = await newUnit()
    const created = await tester.post('/api/fit-tests', body({ maskUnitId: unit.id }))
    const done = await tester.post(`/api/fit-tests/${created.body.id}/finish`, { version: created.body.version })
    expect(done.status).toBe(200)
    await setState(tester, unit.id, 'held', 'Valve seat worn')
    const draft = await tester.post(`/api/fit-tests/${done.body.id}/revisions`, { reason: 'The tester name was recorded wrongly.' })
    expect(draft.status).toBe(201)
    const corrected = await tester.post(`/api/fit-tests/${draft.body.id}/finish`, { version: draft.body.version })
    expect(corrected.status, JSON.stringify(corrected.body)).toBe(200)
    expect(corrected.body.maskUnit).toMatchObject({ id: unit.id })
  })
})

describe('headform retests on the overview', () => {
  // Source: common practice (no published source) — a retest is overdue once its due day has
  // passed where the unit is kept; a day still running there is not overdue, whatever UTC says.
  const dayBefore = (day: string) => new Date(Date.parse(`${day}T00:00:00Z`) - DAY_MS).toISOString().slice(0, 10)
  const localToday = (timeZone: string) => new Intl.DateTimeFormat('en-CA', { timeZone, year: 'numeric', month: '2-digit', day: '2-digit' }).format(new Date())

  it('says overdue by the day in the unit\'s own zone, ahead of UTC or behind it', async () => {
    const db = testDb()
    const [east, west] = await db.insert(schema.sites).values([
      { organizationId: org.id, name: 'Line Islands yard', timeZone: 'Pacific/Kiritimati' },
      { organizationId: org.id, name: 'Samoa yard', timeZone: 'Pacific/Pago_Pago' }
    ]).returning()
    const [ahead, behind] = [await newUnit(), await newUnit()]
    // Due yesterday on Kiritimati (UTC+14): overdue there, even while it is still that day in UTC.
    await db.update(schema.maskUnits).set({ siteId: east!.id, headformDueOn: dayBefore(localToday('Pacific/Kiritimati')) }).where(eq(schema.maskUnits.id, ahead.id))
    // Due today in Pago Pago (UTC−11): not overdue yet, even once UTC has moved on to the next day.
    await db.update(schema.maskUnits).set({ siteId: west!.id, headformDueOn: localToday('Pacific/Pago_Pago') }).where(eq(schema.maskUnits.id, behind.id))

    const reply = await tester.get('/api/overview/equipment')
    expect(reply.status).toBe(200)
    const retest = (id: string) => (reply.body.retestsDue as { id: string, overdue: boolean }[]).find(u => u.id === id)
    expect(retest(ahead.id)?.overdue).toBe(true)
    expect(retest(behind.id)?.overdue).toBe(false)
  })
})
