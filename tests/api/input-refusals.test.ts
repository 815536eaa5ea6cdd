/**
 * Input that used to reach the database and come back as a server error: each is now refused with
 * a 4xx and a message naming what to fix, and what was saved before stays as it was.
 */
import { randomUUID } from 'node:crypto'
import { and, eq } from 'drizzle-orm'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import * as schema from '../../server/database/schema'
import { closeTestDb, createOrganization, createProgram, testDb } from '../support/fixtures'
import type { FixtureOrganization, FixtureProgram } from '../support/fixtures'
import { signedIn } from '../support/http'
import type { Client } from '../support/http'

let org: FixtureOrganization
let program: FixtureProgram
let admin: Client
beforeAll(async () => {
  org = await createOrganization('Refusals')
  program = await createProgram(org)
  admin = await signedIn(org.users.admin.email, org.users.admin.password)
})
afterAll(closeTestDb)

describe('text that cannot be stored', () => {
  it.each([
    ['a NUL character', 'Harness\u0000 strap', /NUL/],
    ['half of a surrogate pair', 'Lens \ud800 check', /broken character/],
    ['a trailing low surrogate', 'Valve \udc00', /broken character/]
  ])('%s in a field gives 400 naming the field', async (_what, text, message) => {
    const reply = await admin.post('/api/people', { fullName: 'Avery Quill', notes: text })
    expect(reply.status).toBe(400)
    expect(reply.body.data.fieldErrors.notes).toMatch(message)
    expect(reply.body.message).toContain('\'notes\'')
  })

  it('names a field deep inside the body, and a bad key', async () => {
    const nested = await admin.post('/api/readiness-templates', { name: 'Morning', scope: 'counter', steps: [{ name: 'Zero\u0000', instruction: 'x', rule: { kind: 'pass-fail' } }] })
    expect(nested.status).toBe(400)
    expect(Object.keys(nested.body.data.fieldErrors)).toEqual(['steps.0.name'])
    const key = await admin.post('/api/people', { 'fullName': 'Avery Quill', 'no\u0000te': 'x' })
    expect(key.status).toBe(400)
  })

  it('keeps a real emoji and accented text as typed', async () => {
    const reply = await admin.post('/api/people', { fullName: 'Zoë Marsh 😷', employeeNumber: `R-${randomUUID().slice(0, 6)}` })
    expect(reply.status).toBe(201)
    expect(reply.body.fullName).toBe('Zoë Marsh 😷')
  })

  it('refuses a NUL in a filter with 400 and in an id with 404', async () => {
    expect((await admin.get('/api/people?q=a%00b')).status).toBe(400)
    expect((await admin.get(`/api/people/${program.personId}%00`)).status).toBe(404)
  })
})

describe('duplicates', () => {
  it('renaming a mask type to an existing name is a 409 beside the name, and changes nothing', async () => {
    const first = await admin.post('/api/mask-types', { name: 'Brigade full face', headformRetestDays: 365 })
    const second = await admin.post('/api/mask-types', { name: 'Brigade full face, spare', headformRetestDays: 365 })
    const reply = await admin.patch(`/api/mask-types/${second.body.id}`, { name: 'Brigade full face' })
    expect(reply.status).toBe(409)
    expect(reply.body.data.fieldErrors.name).toMatch(/Another mask type has this name/)
    const [row] = await testDb().select().from(schema.maskTypes).where(eq(schema.maskTypes.id, second.body.id))
    expect(row!.name).toBe('Brigade full face, spare')
    expect(first.status).toBe(201)
  })

  it('renaming a catalogue model onto another make and model is a 409', async () => {
    const reply = await admin.patch(`/api/respirator-models/${program.fullFacepieceId}`, { model: 'FX-2 half mask' })
    expect(reply.status).toBe(409)
    expect(reply.body.data.fieldErrors.model).toMatch(/already lists this make and model/)
  })

  it('the same user created twice at once: one 201 and one 409', async () => {
    for (let i = 0; i < 5; i++) {
      const body = { email: `twice.${randomUUID().slice(0, 8)}@fixture.example`, displayName: 'Twice Made', role: 'tester' }
      const replies = await Promise.all([admin.post('/api/users', body), admin.post('/api/users', body)])
      expect(replies.map(r => r.status).sort()).toEqual([201, 409])
    }
  })

  it('the same people import sent twice at once reads as twice in a row: created, then updated, no duplicates', async () => {
    const rows = Array.from({ length: 20 }, (_, i) => ({ fullName: `Import Person ${i}`, employeeNumber: `IMP-${i}-${randomUUID().slice(0, 4)}` }))
    const replies = await Promise.all([admin.post('/api/imports/people', { rows }), admin.post('/api/imports/people', { rows })])
    expect(replies.map(r => r.status)).toEqual([200, 200])
    expect(replies.map(r => r.body.created).sort()).toEqual([0, 20])
    expect(replies.map(r => r.body.updated).sort()).toEqual([0, 20])
    const saved = await testDb().select().from(schema.people).where(and(eq(schema.people.organizationId, org.id), eq(schema.people.employeeNumber, rows[0]!.employeeNumber)))
    expect(saved).toHaveLength(1)
  })
})

describe('values outside what can be real', () => {
  it('an empty change to a catalogue model is refused, not a server error', async () => {
    const reply = await admin.patch(`/api/respirator-models/${program.halfMaskId}`, {})
    expect(reply.status).toBe(400)
    expect(reply.body.message).toMatch(/Nothing to change/)
  })

  it.each([
    ['a year-0 clearance date', { medicalClearanceOn: '0000-01-01' }, 'medicalClearanceOn', /from 1900/],
    ['a clearance date next decade', { medicalClearanceOn: '2039-05-01' }, 'medicalClearanceOn', /future/]
  ])('%s is refused beside the field', async (_what, fields, field, message) => {
    const reply = await admin.post('/api/people', { fullName: 'Dated Person', ...fields })
    expect(reply.status).toBe(400)
    expect(reply.body.data.fieldErrors[field]).toMatch(message)
  })

  it('a calibration date in year 9999 and a fit test in year 0 are refused', async () => {
    const counter = await admin.post('/api/counters', { serialNumber: `Y-${randomUUID().slice(0, 6)}`, sampleFlowCm3PerMin: 100, calibrationDueOn: '9999-12-31' })
    expect(counter.status).toBe(400)
    expect(counter.body.data.fieldErrors.calibrationDueOn).toMatch(/before the year 3000/)
    const test = await admin.post('/api/fit-tests', {
      idempotencyKey: randomUUID(), personId: program.personId, respiratorModelId: program.halfMaskId, respiratorSize: 'M',
      protocolKey: 'osha-standard', counterId: program.counterId, siteId: program.siteId, performedAt: '0000-01-01T00:00:00Z'
    })
    expect(test.status).toBe(400)
    expect(test.body.data.fieldErrors.performedAt).toMatch(/1900/)
  })

  it('a headform inside concentration of 1e308 is refused beside the field', async () => {
    const reply = await admin.post('/api/headform-tests', { maskUnitId: randomUUID(), benchRigId: randomUUID(), outside: 25_000, inside: 1e308, sampleSeconds: 60 })
    expect(reply.status).toBe(400)
    expect(reply.body.data.fieldErrors.inside).toMatch(/beyond any counter/)
  })

  it('a draft version beyond any count of saves is a 400, not a database error', async () => {
    const reply = await admin.post(`/api/fit-tests/${randomUUID()}/finish`, { version: 1e20 })
    expect(reply.status).toBe(400)
  })

  it('a body that is not JSON, or a number too large for JSON, is a 400', async () => {
    const { RawBody } = await import('../support/http')
    const reply = await admin.fetch('POST', '/api/mask-types', new RawBody('{"name": "X", "headformRetestDays": 1e400}'))
    expect(reply.status).toBe(400)
  })
})
