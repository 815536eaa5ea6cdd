import { execFileSync } from 'node:child_process'
import { randomUUID, createHash } from 'node:crypto'
import { and, eq } from 'drizzle-orm'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import * as schema from '../../server/database/schema'
import { Client, signedIn } from '../support/http'
import { closeTestDb, createOrganization, createProgram, testDb } from '../support/fixtures'
import type { FixtureOrganization, FixtureProgram } from '../support/fixtures'
import { STANDARD_PROTOCOL } from '../../shared/utils/compute'
import { allPreTestMet, standardEntry, syntheticSeries } from '../support/fit-test-inputs'

let org: FixtureOrganization
let program: FixtureProgram
let tester: Client
beforeAll(async () => {
  org = await createOrganization('FitTests')
  program = await createProgram(org, { wearerUserId: org.users.wearer.id })
  tester = await signedIn(org.users.tester.email, org.users.tester.password)
})
afterAll(closeTestDb)

function newTest(overrides: Record<string, unknown> = {}) {
  return {
    idempotencyKey: randomUUID(),
    personId: program.personId,
    respiratorModelId: program.halfMaskId,
    respiratorSize: 'M',
    protocolKey: 'osha-standard',
    counterId: program.counterId,
    siteId: program.siteId,
    performedAt: '2026-11-20T15:00:00Z',
    preTest: allPreTestMet,
    ...overrides
  }
}

async function finishedTest(fitFactors: number[]) {
  const created = await tester.post('/api/fit-tests', newTest({ entry: standardEntry(fitFactors) }))
  const finished = await tester.post(`/api/fit-tests/${created.body.id}/finish`, { version: created.body.version })
  expect(finished.status, JSON.stringify(finished.body)).toBe(200)
  return finished.body
}

describe('creating a draft', () => {
  it('starts a draft with a blank grid and names what is still missing', async () => {
    const reply = await tester.post('/api/fit-tests', newTest())
    expect(reply.status).toBe(201)
    expect(reply.body).toMatchObject({ status: 'draft', revision: 1, version: 1, respiratorMake: 'Fixture Safety', respiratorSize: 'M', passLevel: 100 })
    expect(reply.body.entry.exercises).toHaveLength(8)
    expect(reply.body.result.ok).toBe(false)
    expect(reply.body.result.issues[0].message).toMatch(/Normal breathing \(start\)/)
  })

  it('makes one test however often a request with the same idempotency key is retried', async () => {
    const body = newTest()
    const [a, b] = await Promise.all([tester.post('/api/fit-tests', body), tester.post('/api/fit-tests', body)])
    const c = await tester.post('/api/fit-tests', body)
    expect(new Set([a.body.id, b.body.id, c.body.id]).size).toBe(1)
    const rows = await testDb().select().from(schema.fitTests).where(and(eq(schema.fitTests.organizationId, org.id), eq(schema.fitTests.idempotencyKey, body.idempotencyKey)))
    expect(rows).toHaveLength(1)
  })

  it.each([
    ['personId', { personId: 'nobody' }, /person/i],
    ['respiratorModelId', { respiratorModelId: 'x' }, /respirator model/i],
    ['respiratorSize', { respiratorSize: '' }, /size/i],
    ['protocolKey', { protocolKey: 'made-up' }, /protocol/i],
    ['counterId', { counterId: null }, /counter/i],
    ['siteId', { siteId: 42 }, /site/i],
    ['performedAt', { performedAt: 'yesterday' }, /date and time/i],
    ['idempotencyKey', { idempotencyKey: 'x' }, /idempotency/i]
  ])('says what to fix when %s is bad', async (field, change, message) => {
    const reply = await tester.post('/api/fit-tests', newTest(change))
    expect(reply.status).toBe(400)
    expect(reply.body.data.fieldErrors[field]).toMatch(message)
  })

  it('refuses a size the model does not come in, and a person of another organization', async () => {
    const wrongSize = await tester.post('/api/fit-tests', newTest({ respiratorSize: 'XL' }))
    expect(wrongSize.status).toBe(400)
    expect(wrongSize.body.data.fieldErrors.respiratorSize).toBe('Fixture Safety FX-2 half mask comes in S, M, L.')
    const other = await createOrganization('Elsewhere')
    const otherProgram = await createProgram(other)
    const foreign = await tester.post('/api/fit-tests', newTest({ personId: otherProgram.personId }))
    expect(foreign.status).toBe(400)
    expect(foreign.body.data.fieldErrors.personId).toMatch(/roster/)
  })
})

describe('saving a draft', () => {
  it('recomputes every number itself and ignores fit factors the client sent', async () => {
    const created = await tester.post('/api/fit-tests', newTest())
    const entry = standardEntry([1000, 1000, 1000, 1000, 1000, 1000, 10])
    const forged = { ...entry, exercises: entry.exercises.map(e => ({ ...e, fitFactor: 5000 })) }
    const saved = await tester.patch(`/api/fit-tests/${created.body.id}`, { version: 1, entry: forged, overallFitFactor: 5000, passed: true, passLevel: 1 })
    expect(saved.status).toBe(200)
    // [1000×6, 10] → 66.04: 29 CFR 1910.134 App. A Part I.C.2(c) harmonic mean (DOMAIN.md check value).
    expect(saved.body.overallFitFactor).toBeCloseTo(66.04, 2)
    expect(saved.body.passed).toBe(false)
    expect(saved.body.passLevel).toBe(100)
    expect(saved.body.result.limiting.exerciseKey).toBe('normal-breathing-end')
    expect(saved.body.version).toBe(2)
  })

  it('rejects a stale edit so two testers cannot overwrite each other', async () => {
    const created = await tester.post('/api/fit-tests', newTest())
    const colleague = await signedIn(org.users.tester.email, org.users.tester.password)
    expect((await colleague.patch(`/api/fit-tests/${created.body.id}`, { version: 1, respiratorSize: 'L' })).status).toBe(200)
    const stale = await tester.patch(`/api/fit-tests/${created.body.id}`, { version: 1, respiratorSize: 'S' })
    expect(stale.status).toBe(409)
    expect(stale.body.message).toMatch(/someone else saved/i)
    expect((await tester.get(`/api/fit-tests/${created.body.id}`)).body.respiratorSize).toBe('L')
  })

  it('names the exercise and field of a bad value', async () => {
    const created = await tester.post('/api/fit-tests', newTest())
    const entry = standardEntry([200, 200, 200, 200, 200, 200, 200])
    entry.exercises[4]!.ambientBefore = -5
    const reply = await tester.patch(`/api/fit-tests/${created.body.id}`, { version: 1, entry })
    expect(reply.status).toBe(400)
    expect(reply.body.data.fieldErrors['entry.exercises.4.ambientBefore']).toMatch(/cannot be negative/)
  })
})

describe('finishing', () => {
  it('refuses while a pre-test item is not met, naming it', async () => {
    const created = await tester.post('/api/fit-tests', newTest({ entry: standardEntry([500, 500, 500, 500, 500, 500, 500]), preTest: { ...allPreTestMet, nothingCrossingSeal: false } }))
    const reply = await tester.post(`/api/fit-tests/${created.body.id}/finish`, { version: 1 })
    expect(reply.status).toBe(409)
    expect(reply.body.message).toMatch(/sealing surface/)
  })

  it('refuses while readings are missing', async () => {
    const created = await tester.post('/api/fit-tests', newTest())
    const reply = await tester.post(`/api/fit-tests/${created.body.id}/finish`, { version: 1 })
    expect(reply.status).toBe(409)
    expect(reply.body.message).toMatch(/cannot be finished yet/)
  })

  it('passes at exactly the pass level, sets the due date a year on, and locks the record', async () => {
    // 100 passes: 29 CFR 1910.134(f)(7), the verdict uses ≥ (DOMAIN.md boundary case).
    const done = await finishedTest([100, 100, 100, 100, 100, 100, 100])
    expect(done).toMatchObject({ status: 'finished', passed: true, passLevel: 100, dueOn: '2027-11-20' })
    expect(done.cardToken).toMatch(/^[\w-]{30,}$/)
    const edit = await tester.patch(`/api/fit-tests/${done.id}`, { version: done.version, respiratorSize: 'L' })
    expect(edit.status).toBe(409)
    expect(edit.body.message).toMatch(/finished and locked/)
  })

  it('uses the full facepiece pass level of the rule set', async () => {
    // 29 CFR 1910.134(f)(7): full facepiece 500 under US OSHA.
    const created = await tester.post('/api/fit-tests', newTest({ respiratorModelId: program.fullFacepieceId, entry: standardEntry([499, 499, 499, 499, 499, 499, 499]) }))
    expect(created.body).toMatchObject({ passLevel: 500, passed: false })
  })
})

describe('correcting a finished record', () => {
  it('needs a reason, makes a new revision, and keeps the earlier one readable', async () => {
    const first = await finishedTest([90, 90, 90, 90, 90, 90, 90])
    expect(first.passed).toBe(false)
    expect((await tester.post(`/api/fit-tests/${first.id}/revisions`, { reason: '' })).status).toBe(400)
    const draft = await tester.post(`/api/fit-tests/${first.id}/revisions`, { reason: 'Ambient readings were typed into the wrong column.' })
    expect(draft.status).toBe(201)
    expect(draft.body).toMatchObject({ revision: 2, status: 'draft', recordId: first.recordId, revisionReason: 'Ambient readings were typed into the wrong column.' })
    expect((await tester.post(`/api/fit-tests/${first.id}/revisions`, { reason: 'A second correction at once' })).status).toBe(409)

    await tester.patch(`/api/fit-tests/${draft.body.id}`, { version: 1, entry: standardEntry([300, 300, 300, 300, 300, 300, 300]) })
    const finished = await tester.post(`/api/fit-tests/${draft.body.id}/finish`, { version: 2 })
    expect(finished.body).toMatchObject({ status: 'finished', passed: true, revision: 2 })
    expect(finished.body.revisions.map((r: { status: string }) => r.status)).toEqual(['superseded', 'finished'])

    const earlier = await tester.get(`/api/fit-tests/${first.id}`)
    expect(earlier.body).toMatchObject({ status: 'superseded', passed: false })
    expect(earlier.body.overallFitFactor).toBeCloseTo(90, 6)

    const trail = await testDb().select().from(schema.auditEvents).where(eq(schema.auditEvents.organizationId, org.id))
    const actions = trail.filter(e => e.entityId === first.id || e.entityId === draft.body.id).map(e => e.action)
    expect(actions).toEqual(expect.arrayContaining(['created', 'finished', 'revision-started', 'draft-saved']))
  })
})

describe('the fit card', () => {
  it('is a PDF with the factor and due date, verifies as valid, then as withdrawn', async () => {
    const done = await finishedTest([250, 400, 300, 350, 280, 260, 320])
    expect((await new Client().get(`/api/fit-tests/${done.id}/card`)).status).toBe(401)
    const pdf = await tester.fetch('GET', `/api/fit-tests/${done.id}/card`)
    expect(pdf.status).toBe(200)
    expect(pdf.headers.get('content-type')).toBe('application/pdf')
    const text = execFileSync('pdftotext', ['-', '-'], { input: Buffer.from(await pdf.arrayBuffer()) }).toString()
    expect(text).toContain(done.overallFitFactor.toFixed(1).slice(0, 4))
    expect(text).toMatch(/20 Nov 2027/)
    expect(text).toContain('Rowan Testwell')

    const verify = await new Client().get(`/api/verify/${done.cardToken}`)
    expect(verify.body).toMatchObject({ state: 'valid', initials: 'R. T.', size: 'M', dueOn: '2027-11-20' })
    expect(JSON.stringify(verify.body)).not.toContain('Rowan')

    // Withdrawal is a program decision: the reviewer recommends it, an admin or tester makes it.
    const reviewer = await signedIn(org.users.reviewer.email, org.users.reviewer.password)
    expect((await reviewer.post(`/api/fit-tests/${done.id}/withdraw`, { reason: 'Tested with the wrong counter.' })).status).toBe(403)
    expect((await tester.post(`/api/fit-tests/${done.id}/withdraw`, { reason: 'Tested with the wrong counter.' })).status).toBe(200)
    expect((await new Client().get(`/api/verify/${done.cardToken}`)).body.state).toBe('withdrawn')
  })

  it('is not issued for a failed test', async () => {
    const failed = await finishedTest([50, 50, 50, 50, 50, 50, 50])
    expect((await tester.get(`/api/fit-tests/${failed.id}/card`)).status).toBe(409)
  })
})

describe('entering a pasted count series', () => {
  it('segments the series by the protocol, keeps the upload and its SHA-256, and finishes', async () => {
    // Every in-mask phase at ambient/100 → each exercise 100 → overall exactly 100 (harmonic mean of equal values).
    const text = syntheticSeries(STANDARD_PROTOCOL, 5000, 100)
    const created = await tester.post('/api/fit-tests', newTest({ entry: { mode: 'series' }, seriesText: text }))
    expect(created.status).toBe(201)
    expect(created.body.overallFitFactor).toBeCloseTo(100, 6)
    expect(created.body.seriesSha256).toBe(createHash('sha256').update(text).digest('hex'))
    const done = await tester.post(`/api/fit-tests/${created.body.id}/finish`, { version: 1 })
    expect(done.body).toMatchObject({ status: 'finished', passed: true })
  })

  it('names the row and column of a bad reading and will not finish', async () => {
    const text = syntheticSeries(STANDARD_PROTOCOL, 5000, 100).replace('\n20,', '\n20,oops,')
    const created = await tester.post('/api/fit-tests', newTest({ entry: { mode: 'series' }, seriesText: text }))
    expect(created.body.seriesIssues[0]).toMatchObject({ row: 22 })
    expect(created.body.seriesIssues[0].message).toBeTruthy()
  })
})

describe('qualitative tests', () => {
  it('records the agent and the outcome, and a pass gets a card and a due date', async () => {
    const created = await tester.post('/api/fit-tests', newTest({ kind: 'qualitative', protocolKey: 'qualitative-app-a', counterId: null, entry: { mode: 'qualitative', qualitative: { agent: 'saccharin', result: 'pass' } } }))
    expect(created.status).toBe(201)
    const done = await tester.post(`/api/fit-tests/${created.body.id}/finish`, { version: 1 })
    expect(done.body).toMatchObject({ status: 'finished', kind: 'qualitative', passed: true, dueOn: '2027-11-20', overallFitFactor: null })
    expect((await tester.fetch('GET', `/api/fit-tests/${done.body.id}/card`)).status).toBe(200)
  })

  it('will not finish without an outcome', async () => {
    const created = await tester.post('/api/fit-tests', newTest({ kind: 'qualitative', protocolKey: 'qualitative-app-a', counterId: null }))
    const reply = await tester.post(`/api/fit-tests/${created.body.id}/finish`, { version: 1 })
    expect(reply.status).toBe(409)
    expect(reply.body.message).toMatch(/agent and whether/)
  })
})

describe('coverage by the counter\'s readiness check', () => {
  it('flags a test with no check that day, refuses it when the program says so, and covers it after a passing check', async () => {
    const local = await createOrganization('Coverage')
    const localProgram = await createProgram(local)
    const localTester = await signedIn(local.users.tester.email, local.users.tester.password)
    await testDb().update(schema.organizations).set({ settings: { uncoveredResults: 'refuse' } }).where(eq(schema.organizations.id, local.id))
    const body = {
      ...newTest(), personId: localProgram.personId, respiratorModelId: localProgram.halfMaskId, counterId: localProgram.counterId, siteId: localProgram.siteId,
      performedAt: '2026-11-20T15:00:00Z', entry: standardEntry([200, 200, 200, 200, 200, 200, 200])
    }
    const created = await localTester.post('/api/fit-tests', body)
    expect(created.body.coverage).toMatchObject({ covered: false, reason: 'no-check-that-day' })
    const refused = await localTester.post(`/api/fit-tests/${created.body.id}/finish`, { version: 1 })
    expect(refused.status).toBe(409)
    expect(refused.body.message).toMatch(/refuses results no readiness check covers/)

    // A passing check of the same counter at 08:00 New York time the same day (fixture site zone).
    await testDb().insert(schema.readinessChecks).values({
      organizationId: local.id, templateName: 'Fixture counter check', counterId: localProgram.counterId, siteId: localProgram.siteId,
      steps: [], status: 'passed', startedAt: new Date('2026-11-20T12:50:00Z'), completedAt: new Date('2026-11-20T13:00:00Z')
    })
    const covered = await localTester.get(`/api/fit-tests/${created.body.id}`)
    expect(covered.body.coverage).toMatchObject({ covered: true, reason: 'covered' })
    expect((await localTester.post(`/api/fit-tests/${created.body.id}/finish`, { version: 1 })).status).toBe(200)
    const list = await localTester.get('/api/fit-tests')
    expect(list.body.rows[0].coverage.covered).toBe(true)
  })
})

describe('who may do what', () => {
  it('keeps another organization\'s tests invisible', async () => {
    const done = await finishedTest([200, 200, 200, 200, 200, 200, 200])
    const other = await createOrganization('Outsider')
    const outsider = await signedIn(other.users.tester.email, other.users.tester.password)
    expect((await outsider.get(`/api/fit-tests/${done.id}`)).status).toBe(404)
    expect((await outsider.post(`/api/fit-tests/${done.id}/revisions`, { reason: 'Trying to reach in' })).status).toBe(404)
    expect((await outsider.get(`/api/fit-tests/${done.id}/card`)).status).toBe(404)
    const list = await outsider.get('/api/fit-tests')
    expect(list.body.rows.some((r: { id: string }) => r.id === done.id)).toBe(false)
  })

  it('lets reviewers and trainers read but not record', async () => {
    const done = await finishedTest([200, 200, 200, 200, 200, 200, 200])
    for (const role of ['reviewer', 'trainer'] as const) {
      const client = await signedIn(org.users[role].email, org.users[role].password)
      expect((await client.get(`/api/fit-tests/${done.id}`)).status).toBe(200)
      expect((await client.post('/api/fit-tests', newTest())).status).toBe(403)
      expect((await client.post(`/api/fit-tests/${done.id}/revisions`, { reason: 'Not allowed here' })).status).toBe(403)
    }
    const trainer = await signedIn(org.users.trainer.email, org.users.trainer.password)
    expect((await trainer.post(`/api/fit-tests/${done.id}/withdraw`, { reason: 'Not allowed here' })).status).toBe(403)
  })

  it('shows a wearer only their own records', async () => {
    const mine = await finishedTest([200, 200, 200, 200, 200, 200, 200])
    const otherPerson = await testDb().insert(schema.people).values({ organizationId: org.id, fullName: 'Someone Else', medicalClearanceStatus: 'cleared' }).returning()
    const theirs = await tester.post('/api/fit-tests', newTest({ personId: otherPerson[0]!.id }))
    const wearer = await signedIn(org.users.wearer.email, org.users.wearer.password)
    expect((await wearer.get(`/api/fit-tests/${mine.id}`)).status).toBe(200)
    expect((await wearer.get(`/api/fit-tests/${mine.id}/card`)).status).toBe(200)
    expect((await wearer.get(`/api/fit-tests/${theirs.body.id}`)).status).toBe(404)
    const list = await wearer.get('/api/fit-tests')
    expect(list.body.rows.every((r: { personId: string }) => r.personId === program.personId)).toBe(true)
    expect((await wearer.post('/api/fit-tests', newTest())).status).toBe(403)
    expect((await wearer.get('/api/people')).status).toBe(403)
  })
})

describe('the list and its CSV', () => {
  it('filters by result and exports the same rows', async () => {
    await finishedTest([40, 40, 40, 40, 40, 40, 40])
    const fails = await tester.get(`/api/fit-tests?result=fail&personId=${program.personId}`)
    expect(fails.body.total).toBeGreaterThan(0)
    expect(fails.body.rows.every((r: { passed: boolean }) => r.passed === false)).toBe(true)
    const csv = await tester.get(`/api/exports/fit-tests.csv?result=fail&personId=${program.personId}`)
    expect(csv.headers.get('content-type')).toMatch(/text\/csv/)
    const lines = String(csv.body).trim().split('\n')
    expect(lines[0]).toContain('overall fit factor')
    expect(lines).toHaveLength(fails.body.total + 1)
    expect(lines.slice(1).every(l => l.includes(',fail,'))).toBe(true)
  })
})
