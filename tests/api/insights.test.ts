import { randomUUID } from 'node:crypto'
import { and, eq } from 'drizzle-orm'
import Papa from 'papaparse'
import { geometricMean, median } from 'simple-statistics'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import * as schema from '../../server/database/schema'
import { Client, signedIn } from '../support/http'
import { closeTestDb, createOrganization, createProgram, testDb } from '../support/fixtures'
import type { FixtureOrganization, FixtureProgram } from '../support/fixtures'
import { allPreTestMet, standardEntry } from '../support/fit-test-inputs'

// A small program whose every number is known: the panels must agree with sums written here,
// independently of the SQL (check values derived by hand or with simple-statistics).

let org: FixtureOrganization
let program: FixtureProgram
let tester: Client
let reviewer: Client
let people: Record<'drifting' | 'steady' | 'leaky', string>
const finished: { id: string, recordId: string, personKey: string, model: 'half' | 'full', size: string, performedAt: string, overall: number, passed: boolean, limiting: string }[] = []

async function finishTest(personKey: keyof typeof people, model: 'half' | 'full', size: string, performedAt: string, ffs: number[]) {
  const created = await tester.post('/api/fit-tests', {
    idempotencyKey: randomUUID(), personId: people[personKey], respiratorModelId: model === 'half' ? program.halfMaskId : program.fullFacepieceId,
    respiratorSize: size, protocolKey: 'osha-standard', counterId: program.counterId, siteId: program.siteId, performedAt,
    preTest: allPreTestMet, entry: standardEntry(ffs)
  })
  expect(created.status, JSON.stringify(created.body)).toBe(201)
  const done = await tester.post(`/api/fit-tests/${created.body.id}/finish`, { version: created.body.version })
  expect(done.status, JSON.stringify(done.body)).toBe(200)
  finished.push({ id: done.body.id, recordId: done.body.recordId, personKey, model, size, performedAt, overall: done.body.overallFitFactor, passed: done.body.passed, limiting: done.body.limitingExerciseKey })
  return done.body
}

const flat = (ff: number) => Array.from({ length: 7 }, () => ff)

beforeAll(async () => {
  org = await createOrganization('Insights')
  program = await createProgram(org)
  const db = testDb()
  const extra = await db.insert(schema.people).values([
    { organizationId: org.id, siteId: program.siteId, fullName: 'Sable Steadman', medicalClearanceStatus: 'cleared', medicalClearanceOn: '2026-01-15' },
    { organizationId: org.id, siteId: program.siteId, fullName: 'Linden Leakey', medicalClearanceStatus: 'cleared', medicalClearanceOn: '2026-01-15' }
  ]).returning()
  people = { drifting: program.personId, steady: extra[0]!.id, leaky: extra[1]!.id }
  tester = await signedIn(org.users.tester.email, org.users.tester.password)
  reviewer = await signedIn(org.users.reviewer.email, org.users.reviewer.password)
  // A passing readiness check at 11:00 New York time on 2026-02-03 covers both of that day's tests;
  // it is recorded before them, as the app records checks when they are done.
  await db.insert(schema.readinessChecks).values({
    organizationId: org.id, templateName: 'Fixture counter check', counterId: program.counterId, siteId: program.siteId,
    steps: [], status: 'passed', startedAt: new Date('2026-02-03T15:50:00Z'), completedAt: new Date('2026-02-03T16:00:00Z')
  })
  // Drifting: ln FF falls by about 1 a year on the half mask (all pass today).
  await finishTest('drifting', 'half', 'M', '2023-01-10T17:00:00Z', flat(3000))
  await finishTest('drifting', 'half', 'M', '2024-01-10T17:00:00Z', flat(1000))
  await finishTest('drifting', 'half', 'M', '2025-01-10T17:00:00Z', flat(400))
  await finishTest('drifting', 'half', 'M', '2026-01-10T17:00:00Z', flat(150))
  // Steady on the full facepiece: a first-attempt fail (300 < 500), then a pass.
  await finishTest('steady', 'full', 'L', '2026-01-12T17:00:00Z', flat(300))
  await finishTest('steady', 'full', 'L', '2026-01-12T18:00:00Z', flat(2000))
  // Leaky in bending over: [1000×5, 10, 1000] → 66.04, a fail limited by bending.
  await finishTest('leaky', 'half', 'L', '2026-02-03T16:00:00Z', [1000, 1000, 1000, 1000, 1000, 10, 1000])
  await finishTest('leaky', 'half', 'L', '2026-02-03T17:00:00Z', [1000, 1000, 800, 1000, 1000, 1000, 1000])
})
afterAll(closeTestDb)

describe('insights panels match sums written in the test', () => {
  it('pass rates by month: all attempts and first attempts per person and model', async () => {
    const r = await reviewer.get('/api/insights/pass-rates')
    expect(r.status).toBe(200)
    const jan2026 = r.body.periods.find((p: { period: string }) => p.period === '2026-01-01')
    // 2026-01: drifting (pass, not first on the half mask), steady fail (first) and pass (not first).
    expect(jan2026.all).toMatchObject({ successes: 2, trials: 3, small: true, lower: null })
    expect(jan2026.first).toMatchObject({ successes: 0, trials: 1 })
    const feb = r.body.periods.find((p: { period: string }) => p.period === '2026-02-01')
    expect(feb.all).toMatchObject({ successes: 1, trials: 2 })
    expect(feb.first).toMatchObject({ successes: 0, trials: 1 })
    expect(r.body.periods.map((p: { period: string }) => p.period)).toEqual(['2023-01-01', '2024-01-01', '2025-01-01', '2026-01-01', '2026-02-01'])
  })

  it('models and sizes: geometric mean and GSD of the overall factors (simple-statistics)', async () => {
    const r = await reviewer.get('/api/insights/models')
    const halfM = r.body.rows.find((x: { model: string, size: string }) => x.model === 'FX-2 half mask' && x.size === 'M')
    const overalls = finished.filter(f => f.model === 'half' && f.size === 'M').map(f => f.overall)
    expect(halfM.tests).toBe(4)
    expect(halfM.geometricMean).toBeCloseTo(geometricMean(overalls), 6)
    expect(halfM.quantiles[2]).toBeCloseTo(Math.exp(median(overalls.map(Math.log))), 6)
    expect(halfM.firstAttempt).toMatchObject({ successes: 1, trials: 1 })
    const halfL = r.body.rows.find((x: { model: string, size: string }) => x.model === 'FX-2 half mask' && x.size === 'L')
    // first attempt of the leaky person on the half mask is the fail (66.04 < 100).
    expect(halfL.firstAttempt).toMatchObject({ successes: 0, trials: 1 })
  })

  it('which exercise breaks the seal: bending (from "bending-over") limits the leaky test', async () => {
    const r = await reviewer.get('/api/insights/exercises')
    expect(r.status).toBe(200)
    const all = r.body.rows.filter((x: { respiratorModelId: string | null }) => x.respiratorModelId === null)
    const bending = all.find((x: { movement: string }) => x.movement === 'bending')
    const expectedLimiting = finished.filter(f => f.limiting === 'bending-over').length
    expect(bending).toMatchObject({ protocolKey: 'osha-standard', tests: finished.length, limiting: expectedLimiting })
    // Normal breathing at start and end counts as one movement: one row, every test.
    expect(all.filter((x: { movement: string }) => x.movement === 'normal-breathing')).toHaveLength(1)
    // Shares of the penetration add up to 1 in each test, so the mean shares add up to 1 too (derived).
    const total = all.reduce((a: number, x: { meanShare: number }) => a + x.meanShare, 0)
    expect(total).toBeCloseTo(1, 9)
    // The leaky test: 1/10 against 6/1000 → bending's share 0.1/0.106 (derived by hand).
    const leaky = await reviewer.get(`/api/insights/exercises?respiratorSize=L&respiratorModelId=${program.halfMaskId}&to=2026-02-03&from=2026-02-03&testerUserId=${org.users.tester.id}`)
    expect(leaky.body.rows.find((x: { movement: string, respiratorModelId: string | null }) => x.movement === 'bending' && x.respiratorModelId === null).limiting).toBe(1)
  })

  it('whose fit is drifting: the Theil–Sen slope in SQL equals the shared one, and the person is flagged', async () => {
    const r = await reviewer.get('/api/insights/drift')
    expect(r.status).toBe(200)
    expect(r.body.candidates).toBe(1)
    expect(r.body.people).toHaveLength(1)
    const row = r.body.people[0]
    const trend = await reviewer.get(`/api/insights/people/${people.drifting}`)
    const drift = trend.body.models[0].drift
    expect(row.personName).toBe('Rowan Testwell')
    expect(row.slopePerYear).toBeCloseTo(drift.fit.slope, 6)
    expect(row.predictedAtDue).toBeCloseTo(drift.predictedAtDue, 3)
    expect(row.predictsFailBeforeDue).toBe(true)
    expect(drift.flagged).toBe(true)
    // Slopes by hand: ln(1000/3000), ln(400/1000), ln(150/400) per year ≈ −1.10, −0.92, −0.98 … median near −1 (derived).
    expect(row.slopePerYear).toBeLessThan(-0.9)
    expect(row.series).toHaveLength(4)
  })

  it('testers: the one tester equals the organization, within its funnel', async () => {
    const r = await reviewer.get('/api/insights/testers')
    const passed = finished.filter(f => f.passed).length
    expect(r.body.organization).toMatchObject({ tests: finished.length, passed })
    expect(r.body.testers[0]).toMatchObject({ tests: finished.length, passed, small: true, position: null })
  })

  it('coverage by counter and month agrees with the result page', async () => {
    const r = await reviewer.get('/api/insights/coverage')
    const feb = r.body.rows.find((x: { period: string }) => x.period === '2026-02-01')
    let covered = 0
    for (const f of finished.filter(x => x.performedAt.startsWith('2026-02'))) {
      const view = await reviewer.get(`/api/fit-tests/${f.id}`)
      if (view.body.coverage?.covered) covered++
    }
    expect(covered).toBe(2)
    expect(feb).toMatchObject({ tests: 2, covered })
    const jan = r.body.rows.find((x: { period: string }) => x.period === '2026-01-01')
    expect(jan.covered).toBe(0)
  })

  it('an empty filter gives empty panels, and a bad filter is a 400 naming the field', async () => {
    const empty = await reviewer.get('/api/insights/models?from=2030-01-01')
    expect(empty.body.rows).toEqual([])
    const bad = await reviewer.get('/api/insights/models?from=yesterday')
    expect(bad.status).toBe(400)
    expect(bad.body.data.fieldErrors.from).toMatch(/YYYY-MM-DD/)
    expect((await reviewer.get('/api/insights/models?siteId=%00')).status).toBe(400)
  })
})

describe('roles and organizations', () => {
  it('testers read insights; trainers and wearers may not; anonymous must sign in', async () => {
    expect((await tester.get('/api/insights/pass-rates')).status).toBe(200)
    const trainer = await signedIn(org.users.trainer.email, org.users.trainer.password)
    const wearer = await signedIn(org.users.wearer.email, org.users.wearer.password)
    expect((await trainer.get('/api/insights/models')).status).toBe(403)
    expect((await wearer.get('/api/insights/drift')).status).toBe(403)
    expect((await new Client().get('/api/insights/testers')).status).toBe(401)
    expect((await tester.get('/api/reviews/queue')).status).toBe(403)
  })

  it('another organization sees none of these results and cannot review them', async () => {
    const other = await createOrganization('Elsewhere')
    const otherReviewer = await signedIn(other.users.reviewer.email, other.users.reviewer.password)
    expect((await otherReviewer.get('/api/insights/models')).body.rows).toEqual([])
    expect((await otherReviewer.get('/api/reviews/queue')).body.total).toBe(0)
    expect((await otherReviewer.post(`/api/fit-tests/${finished[0]!.id}/countersign`, {})).status).toBe(404)
    expect((await otherReviewer.get(`/api/insights/people/${people.drifting}`)).status).toBe(404)
  })
})

describe('review queue, countersign and query', () => {
  it('lists results oldest first, countersigns one with a comment, audited, and takes it off the queue', async () => {
    const queue = await reviewer.get('/api/reviews/queue')
    expect(queue.body.total).toBe(finished.length)
    expect(queue.body.rows[0].id).toBe(finished[0]!.id)
    expect((await tester.post(`/api/fit-tests/${finished[0]!.id}/countersign`, {})).status).toBe(403)
    const signed = await reviewer.post(`/api/fit-tests/${finished[0]!.id}/countersign`, { comment: 'Counts look right.' })
    expect(signed.status).toBe(201)
    expect(signed.body.review.countersign).toMatchObject({ comment: 'Counts look right.' })
    expect((await reviewer.post(`/api/fit-tests/${finished[0]!.id}/countersign`, {})).status).toBe(409)
    const after = await reviewer.get('/api/reviews/queue')
    expect(after.body.total).toBe(finished.length - 1)
    const audit = await testDb().select().from(schema.auditEvents).where(and(eq(schema.auditEvents.entityId, finished[0]!.id), eq(schema.auditEvents.action, 'countersigned')))
    expect(audit).toHaveLength(1)
  })

  it('sends a query to the tester, who answers it on the record; both audited', async () => {
    const id = finished[4]!.id
    expect((await reviewer.post(`/api/fit-tests/${id}/queries`, { question: '' })).body.data.fieldErrors.question).toMatch(/write/)
    const raised = await reviewer.post(`/api/fit-tests/${id}/queries`, { question: 'Was the strap tension checked before the retest?' })
    expect(raised.status).toBe(201)
    const queryId = raised.body.queries[0].id
    const onRecord = await tester.get(`/api/fit-tests/${id}/review`)
    expect(onRecord.body.queries[0]).toMatchObject({ status: 'open', question: 'Was the strap tension checked before the retest?' })
    expect((await reviewer.post(`/api/fit-tests/${id}/queries/${queryId}/answer`, { answer: 'x' })).status).toBe(403)
    const answered = await tester.post(`/api/fit-tests/${id}/queries/${queryId}/answer`, { answer: 'Yes, and the size was changed from M to L.' })
    expect(answered.status).toBe(200)
    expect(answered.body.queries[0]).toMatchObject({ status: 'answered', answer: 'Yes, and the size was changed from M to L.' })
    expect((await tester.post(`/api/fit-tests/${id}/queries/${queryId}/answer`, { answer: 'again' })).status).toBe(409)
    const actions = (await testDb().select().from(schema.auditEvents).where(eq(schema.auditEvents.entityId, id))).map(a => a.action)
    expect(actions).toEqual(expect.arrayContaining(['query-raised', 'query-answered']))
  })

  it('the CSV carries each record\'s countersign and its queries', async () => {
    const csv = await reviewer.get('/api/exports/fit-tests.csv')
    expect(csv.status).toBe(200)
    const lines = Papa.parse<Record<string, string>>(csv.body, { header: true, skipEmptyLines: true }).data
    const signed = lines.find(l => l['record'] === finished[0]!.recordId)!
    expect(signed['countersign comment']).toBe('Counts look right.')
    expect(signed['countersigned by']).not.toBe('')
    const queried = lines.find(l => l['record'] === finished[4]!.recordId)!
    expect(queried).toMatchObject({ 'countersigned by': '', 'open queries': '0', 'answered queries': '1' })
  })

  it('a correction after countersign needs a fresh countersign', async () => {
    const first = finished[0]!
    const draft = await tester.post(`/api/fit-tests/${first.id}/revisions`, { reason: 'Size was recorded wrongly.' })
    expect(draft.status).toBe(201)
    expect((await reviewer.post(`/api/fit-tests/${draft.body.id}/countersign`, {})).status).toBe(409)
    const done = await tester.post(`/api/fit-tests/${draft.body.id}/finish`, { version: draft.body.version })
    expect(done.status).toBe(200)
    const review = await reviewer.get(`/api/fit-tests/${draft.body.id}/review`)
    expect(review.body.countersign).toBeNull()
    expect(review.body.earlierCountersigns).toHaveLength(1)
    const queue = await reviewer.get('/api/reviews/queue')
    expect(queue.body.rows.map((r: { id: string }) => r.id)).toContain(draft.body.id)
    expect((await reviewer.post(`/api/fit-tests/${first.id}/countersign`, {})).status).toBe(409)
  })

  it('keeps exercise rows in step with the raw results of every finished revision', async () => {
    const rows = await testDb().select().from(schema.fitTestExerciseResults).where(eq(schema.fitTestExerciseResults.organizationId, org.id))
    const tests = await testDb().select().from(schema.fitTests).where(eq(schema.fitTests.organizationId, org.id))
    const finishedIds = tests.filter(t => t.status === 'finished' || t.status === 'superseded').map(t => t.id)
    expect(new Set(rows.map(r => r.fitTestId))).toEqual(new Set(finishedIds))
    for (const t of tests.filter(x => x.status === 'finished')) {
      const mine = rows.filter(r => r.fitTestId === t.id)
      expect(mine).toHaveLength(7)
      // overall = harmonic mean of the stored exercise factors (29 CFR 1910.134 App. A, Part I.C.2(c), from memory)
      expect(7 / mine.reduce((a, r) => a + 1 / r.fitFactor, 0)).toBeCloseTo(t.overallFitFactor!, 6)
      expect(mine.find(r => r.isLimiting)!.exerciseKey).toBe(t.limitingExerciseKey)
    }
  })
})

describe('the insights page before its panels answer', () => {
  // Source for the expectation: common practice (no published source) — a panel the server has
  // not computed says it is working; it never says that no fit tests match.
  it('draws every panel as working, never as empty, on the server', async () => {
    const page = await reviewer.fetch('GET', '/insights')
    expect(page.status).toBe(200)
    const html = await page.text()
    expect(html).toContain('Working out this panel')
    expect(html).not.toContain('so there is no pass rate to show')
  })
})
