import { randomUUID } from 'node:crypto'
import { eq } from 'drizzle-orm'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import * as schema from '../../server/database/schema'
import { rebuildInsightFacts } from '../../server/database/insight-facts'
import * as raw from '../../server/database/insight-raw'
import type { InsightFilters } from '../../shared/utils/insight-schemas'
import type { Client } from '../support/http'
import { signedIn } from '../support/http'
import { closeTestDb, createOrganization, createProgram, testDb } from '../support/fixtures'
import type { FixtureOrganization, FixtureProgram } from '../support/fixtures'
import { allPreTestMet, standardEntry } from '../support/fit-test-inputs'

// The insights panels read a summary kept on finish, correction and withdrawal. Here results are
// finished, corrected (a size, a date and the counts change) and withdrawn through the API, two
// finishes for one person and model race, and every panel's numbers, under every filter, must
// equal the same panel worked out straight from the raw rows (server/database/insight-raw.ts,
// the queries the page ran before the summary existed). All data invented.

let org: FixtureOrganization
let program: FixtureProgram
let tester: Client
let admin: Client
let reviewer: Client
let otherSiteId: string
let otherCounterId: string
let customProtocolKey: string
const person: Record<string, string> = {}

const flat = (ff: number) => Array.from({ length: 7 }, () => ff)
const modifiedEntry = (ffs: number[]) => ({
  mode: 'grid' as const,
  wholeTestAmbient: { start: 10_000, end: 10_000 },
  exercises: ['bending', 'jogging-in-place', 'head-side-to-side', 'head-up-and-down'].map((exerciseKey, i) => ({ exerciseKey, inMask: 10_000 / ffs[i]! }))
})
const customEntry = (ffs: number[]) => ({
  mode: 'grid' as const,
  exercises: ['breathing', 'talking'].map((exerciseKey, i) => ({ exerciseKey, ambientBefore: 10_000, ambientAfter: 10_000, inMask: 10_000 / ffs[i]! }))
})

interface Draft { who: string, model?: 'half' | 'full', size?: string, at: string, entry: object, protocolKey?: string, by?: Client, site?: 'main' | 'other' }

async function start(d: Draft) {
  const created = await (d.by ?? tester).post('/api/fit-tests', {
    idempotencyKey: randomUUID(), personId: person[d.who], respiratorModelId: d.model === 'full' ? program.fullFacepieceId : program.halfMaskId,
    respiratorSize: d.size ?? 'M', protocolKey: d.protocolKey ?? 'osha-standard',
    counterId: d.site === 'other' ? otherCounterId : program.counterId, siteId: d.site === 'other' ? otherSiteId : program.siteId,
    performedAt: d.at, preTest: allPreTestMet, entry: d.entry
  })
  expect(created.status, JSON.stringify(created.body)).toBe(201)
  return created.body as { id: string, version: number }
}

async function finish(draft: { id: string, version: number }, by: Client = tester) {
  const done = await by.post(`/api/fit-tests/${draft.id}/finish`, { version: draft.version })
  expect(done.status, JSON.stringify(done.body)).toBe(200)
  return done.body as { id: string, recordId: string }
}

async function correct(id: string, changes: Record<string, unknown>) {
  const draft = await tester.post(`/api/fit-tests/${id}/revisions`, { reason: 'Counts and size were entered wrongly.' })
  expect(draft.status, JSON.stringify(draft.body)).toBe(201)
  const saved = await tester.patch(`/api/fit-tests/${draft.body.id}`, { version: draft.body.version, ...changes })
  expect(saved.status, JSON.stringify(saved.body)).toBe(200)
  return finish(saved.body)
}

async function withdraw(id: string) {
  const r = await tester.post(`/api/fit-tests/${id}/withdraw`, { reason: 'Wrong person recorded.' })
  expect(r.status, JSON.stringify(r.body)).toBe(200)
}

beforeAll(async () => {
  org = await createOrganization('Summary')
  program = await createProgram(org)
  const db = testDb()
  const [site] = await db.insert(schema.sites).values({ organizationId: org.id, name: 'Second Works', timeZone: 'Europe/London' }).returning()
  otherSiteId = site!.id
  const [counter] = await db.insert(schema.counters).values({ organizationId: org.id, siteId: otherSiteId, serialNumber: `FXC-${randomUUID().slice(0, 6)}`, description: 'Second counter', sampleFlowCm3PerMin: 100, calibrationDueOn: '2026-03-31' }).returning()
  otherCounterId = counter!.id
  const extra = await db.insert(schema.people).values(['Ada Steadfast', 'Bram Racer', 'Cleo Custom'].map(fullName => (
    { organizationId: org.id, siteId: program.siteId, fullName, medicalClearanceStatus: 'cleared' as const, medicalClearanceOn: '2026-01-15' }))).returning()
  Object.assign(person, { drift: program.personId, steady: extra[0]!.id, racer: extra[1]!.id, custom: extra[2]!.id })
  tester = await signedIn(org.users.tester.email, org.users.tester.password)
  admin = await signedIn(org.users.admin.email, org.users.admin.password)
  reviewer = await signedIn(org.users.reviewer.email, org.users.reviewer.password)
  customProtocolKey = `summary-${randomUUID().slice(0, 6)}`
  const protocol = await admin.post('/api/protocols', {
    key: customProtocolKey, name: `Summary protocol ${customProtocolKey}`, source: 'Invented for this test', ambientPlan: 'per-exercise',
    exercises: [
      { key: 'breathing', name: 'Normal breathing', durationSeconds: 60, counted: true, sampling: { ambientSeconds: 6, purgeSeconds: 4, maskSeconds: 40, closingAmbientSeconds: 0 } },
      { key: 'talking', name: 'Talking', durationSeconds: 60, counted: true, sampling: { ambientSeconds: 6, purgeSeconds: 4, maskSeconds: 30, closingAmbientSeconds: 6 } }
    ]
  })
  expect(protocol.status, JSON.stringify(protocol.body)).toBe(201)
  // Readiness checks: one passing on the main counter the morning of 2026-02-03 (New York), one
  // failing on the second counter on 2025-11-20 (London).
  await db.insert(schema.readinessChecks).values([
    { organizationId: org.id, templateName: 'Fixture check', counterId: program.counterId, siteId: program.siteId, steps: [], status: 'passed', startedAt: new Date('2026-02-03T13:50:00Z'), completedAt: new Date('2026-02-03T14:00:00Z') },
    { organizationId: org.id, templateName: 'Fixture check', counterId: otherCounterId, siteId: otherSiteId, steps: [], status: 'failed', startedAt: new Date('2025-11-20T08:50:00Z'), completedAt: new Date('2025-11-20T09:00:00Z') }
  ])

  // A fit that falls every year on the half mask, one of them corrected afterwards.
  const drifting = []
  for (const [i, ff] of [3000, 1200, 500, 180].entries()) drifting.push(await finish(await start({ who: 'drift', at: `${2023 + i}-01-10T17:00:00Z`, entry: standardEntry(flat(ff)) })))
  // Steady on the full facepiece, on both sites and by two testers; its first result is withdrawn later.
  const steady = []
  steady.push(await finish(await start({ who: 'steady', model: 'full', size: 'L', at: '2025-11-20T10:00:00Z', entry: standardEntry(flat(300)), site: 'other' })))
  steady.push(await finish(await start({ who: 'steady', model: 'full', size: 'L', at: '2026-02-03T16:00:00Z', entry: standardEntry(flat(2500)), by: admin }), admin))
  steady.push(await finish(await start({ who: 'steady', model: 'full', size: 'L', at: '2026-02-03T18:00:00Z', entry: modifiedEntry([900, 4000, 4000, 4000]), protocolKey: 'osha-modified-elastomeric' })))
  steady.push(await finish(await start({ who: 'steady', model: 'full', size: 'M', at: '2026-06-01T15:00:00Z', entry: standardEntry([2000, 2000, 2000, 2000, 2000, 150, 2000]) })))
  // A custom protocol whose 'breathing' is no canonical movement.
  await finish(await start({ who: 'custom', at: '2026-03-03T15:00:00Z', entry: customEntry([400, 90]), protocolKey: customProtocolKey }))
  await finish(await start({ who: 'custom', at: '2026-03-04T15:00:00Z', entry: customEntry([60, 900]), protocolKey: customProtocolKey, size: 'S' }))
  // Two results for one person and model finished at the same moment: both must count.
  const racing = await Promise.all([
    start({ who: 'racer', at: '2026-04-01T15:00:00Z', entry: standardEntry(flat(800)) }),
    start({ who: 'racer', at: '2026-04-02T15:00:00Z', entry: standardEntry(flat(90)) }),
    start({ who: 'racer', at: '2026-04-03T15:00:00Z', entry: standardEntry(flat(120)) })
  ])
  await Promise.all(racing.map(d => finish(d)))
  // Corrections: counts and size of a drifting result; the first of the racer's moved after the others.
  await correct(drifting[1]!.id, { respiratorSize: 'L', entry: { exercises: standardEntry(flat(2500)).exercises } })
  await correct(racing[0]!.id, { performedAt: '2026-04-05T15:00:00Z' })
  // A withdrawal: the steady person's first result, so a later one becomes their first attempt.
  await withdraw(steady[0]!.id)
})
afterAll(closeTestDb)

/** Same numbers, to 1e-9 relative, whatever the order of rows. */
function expectSame(actual: unknown, expected: unknown, path = '') {
  if (typeof expected === 'number' && typeof actual === 'number') {
    expect(Math.abs(actual - expected), `${path}: ${actual} vs ${expected}`).toBeLessThanOrEqual(1e-9 * Math.max(1, Math.abs(expected)))
  } else if (Array.isArray(expected)) {
    expect(Array.isArray(actual), path).toBe(true)
    expect((actual as unknown[]).length, `${path} length`).toBe(expected.length)
    expected.forEach((e, i) => expectSame((actual as unknown[])[i], e, `${path}[${i}]`))
  } else if (expected && typeof expected === 'object') {
    for (const [k, v] of Object.entries(expected)) expectSame((actual as Record<string, unknown>)[k], v, `${path}.${k}`)
  } else {
    expect(actual, path).toEqual(expected)
  }
}
const byKey = <T>(rows: T[], key: (r: T) => string) => [...rows].sort((a, b) => (key(a) < key(b) ? -1 : key(a) > key(b) ? 1 : 0))
const qs = (f: Partial<InsightFilters>) => new URLSearchParams(Object.entries(f).filter(([, v]) => v !== undefined) as [string, string][]).toString()

describe('the insights summary stays equal to the raw rows', () => {
  const filterSets: [string, () => Partial<InsightFilters>][] = [
    ['no filter', () => ({})],
    ['by quarter', () => ({ bucket: 'quarter' })],
    ['one model', () => ({ respiratorModelId: program.halfMaskId })],
    ['up to a date', () => ({ to: '2025-06-30' })],
    ['from a date', () => ({ from: '2026-02-01' })],
    ['one site', () => ({ siteId: otherSiteId })],
    ['one tester', () => ({ testerUserId: org.users.tester.id })],
    ['one size', () => ({ respiratorSize: 'L' })],
    ['the custom protocol', () => ({ protocolKey: customProtocolKey })]
  ]
  async function expectPanelsEqualRaw(f: Partial<InsightFilters>) {
    const filters: InsightFilters = { bucket: 'month', ...f } as InsightFilters
    const db = testDb()
    const q = qs(f)

    const passRates = await reviewer.get(`/api/insights/pass-rates?${q}`)
    expect(passRates.status).toBe(200)
    expectSame(passRates.body.periods.map((p: { period: string, all: { successes: number, trials: number }, first: { successes: number, trials: number } }) =>
      ({ period: p.period, tests: p.all.trials, passed: p.all.successes, firstTests: p.first.trials, firstPassed: p.first.successes })), await raw.passRatesByPeriod(db, org.id, filters))

    const models = await reviewer.get(`/api/insights/models?${q}`)
    expectSame(models.body.rows, await raw.modelSummaries(db, org.id, filters))

    const exerciseKey = (r: { protocolKey: string, respiratorModelId: string | null, movement: string }) => `${r.protocolKey}|${r.respiratorModelId}|${r.movement}`
    const exercises = await reviewer.get(`/api/insights/exercises?${q}`)
    expectSame(byKey(exercises.body.rows, exerciseKey), byKey(await raw.exerciseSummaries(db, org.id, filters), exerciseKey))

    const driftKey = (r: { personId: string, respiratorModelId: string }) => `${r.personId}|${r.respiratorModelId}`
    const drift = await reviewer.get(`/api/insights/drift?${q}`)
    const rawDrift = await raw.driftingPeople(db, org.id, filters)
    expect(drift.body.candidates).toBe(rawDrift.candidates)
    expectSame(byKey(drift.body.people, driftKey), byKey(rawDrift.people, driftKey))

    const testers = await reviewer.get(`/api/insights/testers?${q}`)
    expectSame(testers.body.testers.map((t: { testerUserId: string, testerName: string, tests: number, passed: number }) =>
      ({ testerUserId: t.testerUserId, testerName: t.testerName, tests: t.tests, passed: t.passed })), await raw.testerSummaries(db, org.id, filters))

    const coverage = await reviewer.get(`/api/insights/coverage?${q}`)
    const rawCoverage = await raw.coverageSummaries(db, org.id, filters)
    expect(coverage.body.withoutCounter).toBe(rawCoverage.withoutCounter)
    expectSame(coverage.body.rows, rawCoverage.rows)
  }

  it.each(filterSets)('every panel, %s', async (_label, make) => {
    await expectPanelsEqualRaw(make())
  })

  it('the scenario reaches every part of the summary', async () => {
    const exercises = (await reviewer.get('/api/insights/exercises')).body.rows as { movement: string, protocolKey: string }[]
    // 'breathing' of the custom protocol is its own movement; 'bending' counts both protocols' bending.
    expect(exercises.some(r => r.movement === 'breathing' && r.protocolKey === customProtocolKey)).toBe(true)
    expect(exercises.filter(r => r.movement === 'bending').map(r => r.protocolKey)).toEqual(expect.arrayContaining(['osha-standard', 'osha-modified-elastomeric']))
    const drift = (await reviewer.get('/api/insights/drift')).body
    expect(drift.people.map((p: { personName: string }) => p.personName)).toContain('Rowan Testwell')
    // The withdrawn result leaves the steady person with three results on the full facepiece.
    const coverage = (await reviewer.get('/api/insights/coverage')).body.rows as { counterId: string, covered: number }[]
    expect(coverage.find(r => r.counterId === otherCounterId)).toBeUndefined()
    expect(coverage.reduce((a, r) => a + r.covered, 0)).toBe(2)
  })

  it('a rebuild from the raw rows gives the summary the write paths kept', async () => {
    const db = testDb()
    const snapshot = async () => ({
      results: byKey(await db.select().from(schema.insightResults).where(eq(schema.insightResults.organizationId, org.id)), r => r.fitTestId),
      drift: byKey(await db.select().from(schema.insightDrift).where(eq(schema.insightDrift.organizationId, org.id)), r => `${r.personId}|${r.respiratorModelId}`)
    })
    const kept = await snapshot()
    const current = await db.select({ id: schema.fitTests.id, status: schema.fitTests.status }).from(schema.fitTests).where(eq(schema.fitTests.organizationId, org.id))
    expect(kept.results.map(r => r.fitTestId).sort()).toEqual(current.filter(t => t.status === 'finished').map(t => t.id).sort())
    // One first attempt per person and model.
    expect(kept.results.filter(r => r.firstAttempt)).toHaveLength(new Set(kept.results.map(r => `${r.personId}|${r.respiratorModelId}`)).size)
    await rebuildInsightFacts(db, org.id)
    expectSame(await snapshot(), kept)
  })

  it('a site whose time zone changed after its results were summarized: every panel still equal', async () => {
    // The panels read the stored local days only while every summarized zone is still its site's;
    // here the main site moves from New York to Tokyo, which puts its afternoon results on the
    // next day, after the day of the morning's readiness check.
    const db = testDb()
    const [main] = await db.select({ timeZone: schema.sites.timeZone }).from(schema.sites).where(eq(schema.sites.id, program.siteId))
    await db.update(schema.sites).set({ timeZone: 'Asia/Tokyo' }).where(eq(schema.sites.id, program.siteId))
    try {
      const coverage = (await reviewer.get('/api/insights/coverage')).body.rows as { covered: number }[]
      expect(coverage.reduce((a, r) => a + r.covered, 0)).toBe(0)
      for (const f of [{}, { bucket: 'quarter' as const }, { siteId: program.siteId }, { from: '2026-02-01' }]) await expectPanelsEqualRaw(f)
    } finally {
      await db.update(schema.sites).set({ timeZone: main!.timeZone }).where(eq(schema.sites.id, program.siteId))
    }
  })
})
