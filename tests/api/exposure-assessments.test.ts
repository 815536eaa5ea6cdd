import { randomUUID } from 'node:crypto'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { Client, signedIn } from '../support/http'
import { closeTestDb, createOrganization, createProgram, testDb } from '../support/fixtures'
import type { FixtureOrganization, FixtureProgram } from '../support/fixtures'
import * as schema from '../../server/database/schema'

let a: FixtureOrganization
let b: FixtureOrganization
let program: FixtureProgram
let reviewer: Client
let tester: Client
let trainer: Client
let wearer: Client
let otherReviewer: Client

// 29 CFR 1910.1000(d)(2)(i), its own example without the third substance: 500/1000 + 45/200.
const mixture = {
  contaminants: [
    { name: 'Solvent A', form: 'gas-vapour', exposure: { mode: 'single', value: 5000, unit: 'ppm' }, limit: { value: 1000, unit: 'ppm', kind: 'twa-8h', source: 'fixture limit' }, idlh: null },
    { name: 'Solvent B', form: 'gas-vapour', exposure: { mode: 'single', value: 450, unit: 'ppm' }, limit: { value: 200, unit: 'ppm', kind: 'twa-8h', source: 'fixture limit' }, idlh: null }
  ],
  additiveMixture: true,
  oxygenDeficient: false
}

function draft(over: Record<string, unknown> = {}) {
  return { title: 'Solvent wash bay', input: mixture, chosenClassKeys: ['elastomeric-full-facepiece'], rationale: 'Mixture index 7.25 needs more than a half mask.', ...over }
}

async function passingTest(personId: string, respiratorModelId: string, respiratorClass: string, dueOn: string) {
  await finishedTest(personId, respiratorModelId, respiratorClass, { passed: true, dueOn, performedAt: new Date('2026-01-10T10:00:00Z') })
}

async function finishedTest(personId: string, respiratorModelId: string, respiratorClass: string, result: { passed: boolean, dueOn: string | null, performedAt: Date }) {
  await testDb().insert(schema.fitTests).values({
    organizationId: a.id, recordId: randomUUID(), status: 'finished', personId, siteId: program.siteId, testerUserId: a.users.tester.id,
    respiratorModelId, respiratorMake: 'Fixture Safety', respiratorModel: 'FX', respiratorClass, respiratorSize: 'M',
    protocolKey: 'standard', performedAt: result.performedAt, preTest: {} as never, entry: {} as never,
    passed: result.passed, overallFitFactor: result.passed ? 900 : 40, dueOn: result.dueOn
  })
}

async function clearance(personId: string, respiratorClasses: string[], validUntil: string | null = '2099-01-01') {
  await testDb().insert(schema.medicalClearances).values({
    organizationId: a.id, personId, clearedOn: '2026-01-02', validUntil, clearedBy: 'Fixture clinic', respiratorClasses
  })
}

beforeAll(async () => {
  [a, b] = await Promise.all([createOrganization('Basin'), createOrganization('Ridge')])
  program = await createProgram(a)
  ;[reviewer, tester, trainer, wearer, otherReviewer] = await Promise.all([
    signedIn(a.users.reviewer.email, a.users.reviewer.password),
    signedIn(a.users.tester.email, a.users.tester.password),
    signedIn(a.users.trainer.email, a.users.trainer.password),
    signedIn(a.users.wearer.email, a.users.wearer.password),
    signedIn(b.users.reviewer.email, b.users.reviewer.password)
  ])
})

afterAll(closeTestDb)

describe('exposure assessments', () => {
  it('a reviewer saves a draft; the server recomputes the required protection factor', async () => {
    const created = await reviewer.post('/api/exposure-assessments', draft())
    expect(created.status).toBe(201)
    const read = await reviewer.get(`/api/exposure-assessments/${created.body.id}`)
    expect(read.status).toBe(200)
    // derived from 29 CFR 1910.1000(d)(2)(i): 5000/1000 + 450/200 = 7.25
    expect(read.body.assessment.requiredProtectionFactor).toBeCloseTo(7.25, 9)
    expect(read.body.result.ok).toBe(true)
    expect(read.body.assessment.status).toBe('draft')
  })

  it('refuses a class whose APF is below the required protection factor, beside the field', async () => {
    const reply = await reviewer.post('/api/exposure-assessments', draft({ chosenClassKeys: ['elastomeric-quarter-mask'] }))
    expect(reply.status).toBe(400)
    expect(reply.body.data.fieldErrors.chosenClassKeys).toContain('not adequate')
    expect(reply.body.message).toContain('not adequate')
  })

  it('puts calculator errors beside their fields', async () => {
    const bad = { ...mixture, contaminants: [{ ...mixture.contaminants[0], limit: { value: null, unit: 'ppm', kind: 'twa-8h', source: '' } }] }
    const reply = await reviewer.post('/api/exposure-assessments', draft({ input: bad }))
    expect(reply.status).toBe(400)
    expect(reply.body.data.fieldErrors['input.contaminants.0.limit.value']).toContain('Exposure limit')
    const zero = await reviewer.post('/api/exposure-assessments', draft({ input: { ...mixture, contaminants: [{ ...mixture.contaminants[0], limit: { value: 0, unit: 'ppm', kind: 'twa-8h', source: '' } }] } }))
    expect(zero.status).toBe(400)
  })

  it('answers hostile bodies with 4xx', async () => {
    for (const body of [null, 'x', { title: 'a\u0000b', input: mixture }, { ...draft(), input: { ...mixture, contaminants: [{ ...mixture.contaminants[0], exposure: { mode: 'single', value: 1e308, unit: 'ppm' } }] } }, { ...draft(), chosenClassKeys: 'x' }]) {
      const reply = await reviewer.post('/api/exposure-assessments', body)
      expect(reply.status, JSON.stringify(body)).toBeGreaterThanOrEqual(400)
      expect(reply.status).toBeLessThan(500)
    }
  })

  it('a signed-off assessment cannot be edited, only revised with a reason', async () => {
    const created = await reviewer.post('/api/exposure-assessments', draft())
    const id = created.body.id
    const signed = await reviewer.post(`/api/exposure-assessments/${id}/sign-off`)
    expect(signed.status).toBe(200)
    const edit = await reviewer.patch(`/api/exposure-assessments/${id}`, { ...draft({ title: 'Changed' }), version: 2 })
    expect(edit.status).toBe(409)
    expect(edit.body.message).toContain('revision')
    expect((await reviewer.post(`/api/exposure-assessments/${id}/revisions`, { reason: '' })).status).toBe(400)
    const revision = await reviewer.post(`/api/exposure-assessments/${id}/revisions`, { reason: 'New sampling results' })
    expect(revision.status).toBe(201)
    expect(revision.body.revision).toBe(2)
    // The signed-off revision stays in force until the new one is signed off.
    const draftRead = await reviewer.get(`/api/exposure-assessments/${revision.body.id}`)
    const version = draftRead.body.assessment.version
    expect((await reviewer.patch(`/api/exposure-assessments/${revision.body.id}`, { ...draft({ title: 'Solvent wash bay, east' }), version: version + 5 })).status).toBe(409)
    expect((await reviewer.patch(`/api/exposure-assessments/${revision.body.id}`, { ...draft({ title: 'Solvent wash bay, east' }), version })).status).toBe(200)
    expect((await reviewer.post(`/api/exposure-assessments/${revision.body.id}/sign-off`)).status).toBe(200)
    const first = await reviewer.get(`/api/exposure-assessments/${id}`)
    expect(first.body.assessment.status).toBe('superseded')
    expect(first.body.revisions.map((r: { status: string }) => r.status)).toEqual(['superseded', 'signed-off'])
  })

  it('sign-off needs a chosen class and a rationale', async () => {
    const created = await reviewer.post('/api/exposure-assessments', draft({ chosenClassKeys: [], rationale: '' }))
    const reply = await reviewer.post(`/api/exposure-assessments/${created.body.id}/sign-off`)
    expect(reply.status).toBe(400)
    expect(Object.keys(reply.body.data.fieldErrors)).toEqual(['chosenClassKeys', 'rationale'])
  })

  it('testers and trainers read; only reviewers and admins write; wearers and strangers are refused', async () => {
    const created = await reviewer.post('/api/exposure-assessments', draft())
    const id = created.body.id
    expect((await tester.get(`/api/exposure-assessments/${id}`)).status).toBe(200)
    expect((await trainer.get('/api/exposure-assessments')).status).toBe(200)
    expect((await tester.post('/api/exposure-assessments', draft())).status).toBe(403)
    expect((await trainer.post(`/api/exposure-assessments/${id}/sign-off`)).status).toBe(403)
    expect((await wearer.get('/api/exposure-assessments')).status).toBe(403)
    expect((await new Client().get('/api/exposure-assessments')).status).toBe(401)
    expect((await tester.get('/api/protection-gaps.csv')).status).toBe(403)
  })

  it('another organization gets 404 and never sees the assessment in its list', async () => {
    const created = await reviewer.post('/api/exposure-assessments', draft())
    const id = created.body.id
    expect((await otherReviewer.get(`/api/exposure-assessments/${id}`)).status).toBe(404)
    expect((await otherReviewer.post(`/api/exposure-assessments/${id}/sign-off`)).status).toBe(404)
    expect((await otherReviewer.post(`/api/exposure-assessments/${id}/assignments`, { jobTitle: 'Operator' })).status).toBe(404)
    const list = await otherReviewer.get('/api/exposure-assessments')
    expect(list.body.some((r: { id: string }) => r.id === id)).toBe(false)
    expect((await otherReviewer.get('/api/exposure-assessments/not-a-uuid')).status).toBe(404)
  })
})

describe('who is protected for the job', () => {
  it('names the gap of a person fitted for a half mask when the job needs a full facepiece, and clears it with a full-facepiece fit', async () => {
    const db = testDb()
    const jobTitle = `Wash bay operator ${randomUUID().slice(0, 4)}`
    const [half, full] = await db.insert(schema.people).values([
      { organizationId: a.id, fullName: 'Avery Halfmask', jobTitle, siteId: program.siteId },
      { organizationId: a.id, fullName: 'Blake Fullface', jobTitle, siteId: program.siteId }
    ]).returning()
    await passingTest(half!.id, program.halfMaskId, 'elastomeric-half-mask', '2099-01-01')
    await passingTest(full!.id, program.fullFacepieceId, 'elastomeric-full-facepiece', '2099-01-01')
    await clearance(half!.id, ['elastomeric-half-mask', 'elastomeric-full-facepiece'])
    await clearance(full!.id, ['elastomeric-full-facepiece'])

    const created = await reviewer.post('/api/exposure-assessments', draft({ title: `Job ${jobTitle}` }))
    const id = created.body.id
    expect((await reviewer.post(`/api/exposure-assessments/${id}/sign-off`)).status).toBe(200)
    expect((await reviewer.post(`/api/exposure-assessments/${id}/assignments`, { jobTitle })).status).toBe(201)
    expect((await reviewer.post(`/api/exposure-assessments/${id}/assignments`, { jobTitle })).status).toBe(409)
    expect((await reviewer.post(`/api/exposure-assessments/${id}/assignments`, { personId: randomUUID() })).status).toBe(400)

    const read = await tester.get(`/api/exposure-assessments/${id}`)
    const byName = Object.fromEntries(read.body.people.map((p: { fullName: string }) => [p.fullName, p]))
    expect(byName['Blake Fullface'].protection.protected).toBe(true)
    expect(byName['Avery Halfmask'].protection.protected).toBe(false)
    expect(byName['Avery Halfmask'].protection.gap).toContain('Fitted for a half mask')
    expect(byName['Avery Halfmask'].protection.gap).toContain('this job needs a full facepiece')

    const gaps = await reviewer.get(`/api/protection-gaps?personId=${half!.id}`)
    expect(gaps.body).toHaveLength(1)
    const csv = await reviewer.fetch('GET', '/api/protection-gaps.csv')
    expect(csv.headers.get('content-type')).toContain('text/csv')
    const text = await csv.text()
    expect(text).toContain('Avery Halfmask')
    expect(text).not.toContain('Blake Fullface')
  })

  it('a later failed test on the same model cancels the earlier pass, and a missing clearance is a named gap', async () => {
    const db = testDb()
    const jobTitle = `Decanting operator ${randomUUID().slice(0, 4)}`
    const [refitted, uncleared, lapsed] = await db.insert(schema.people).values([
      { organizationId: a.id, fullName: 'Casey Failedlater', jobTitle, siteId: program.siteId },
      { organizationId: a.id, fullName: 'Devon Noclearance', jobTitle, siteId: program.siteId },
      { organizationId: a.id, fullName: 'Emery Lapsed', jobTitle, siteId: program.siteId }
    ]).returning()
    // Pass in January, fail in March on the same full facepiece model: the pass no longer counts.
    await passingTest(refitted!.id, program.fullFacepieceId, 'elastomeric-full-facepiece', '2099-01-01')
    await finishedTest(refitted!.id, program.fullFacepieceId, 'elastomeric-full-facepiece', { passed: false, dueOn: null, performedAt: new Date('2026-03-05T10:00:00Z') })
    await clearance(refitted!.id, ['elastomeric-full-facepiece'])
    await passingTest(uncleared!.id, program.fullFacepieceId, 'elastomeric-full-facepiece', '2099-01-01')
    await clearance(uncleared!.id, ['elastomeric-half-mask'])
    await passingTest(lapsed!.id, program.fullFacepieceId, 'elastomeric-full-facepiece', '2099-01-01')
    await clearance(lapsed!.id, ['elastomeric-full-facepiece'], '2026-02-01')

    const created = await reviewer.post('/api/exposure-assessments', draft({ title: `Job ${jobTitle}` }))
    const id = created.body.id
    expect((await reviewer.post(`/api/exposure-assessments/${id}/sign-off`)).status).toBe(200)
    expect((await reviewer.post(`/api/exposure-assessments/${id}/assignments`, { jobTitle })).status).toBe(201)

    const read = await reviewer.get(`/api/exposure-assessments/${id}`)
    const byName = Object.fromEntries(read.body.people.map((p: { fullName: string }) => [p.fullName, p.protection]))
    expect(byName['Casey Failedlater'].protected).toBe(false)
    expect(byName['Casey Failedlater'].gap).toContain('(2026-03-05) did not pass. The earlier pass of 2026-01-10 no longer counts.')
    expect(byName['Devon Noclearance'].protected).toBe(false)
    expect(byName['Devon Noclearance'].gap).toBe('No current medical clearance for a full facepiece: the clearance on file covers a half mask only.')
    expect(byName['Emery Lapsed'].protected).toBe(false)
    expect(byName['Emery Lapsed'].gap).toBe('No current medical clearance for a full facepiece: the last one lapsed on 2026-02-01.')

    const gaps = await reviewer.get('/api/protection-gaps')
    const named = gaps.body.filter((g: { assessmentId: string }) => g.assessmentId === id).map((g: { fullName: string }) => g.fullName).sort()
    expect(named).toEqual(['Casey Failedlater', 'Devon Noclearance', 'Emery Lapsed'])
  })
})
