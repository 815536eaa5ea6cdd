// Demo data that makes Insights worth opening, in each organization (all invented): a model that
// fits poorly in one size, a person whose fit drifts down over three years, a tester whose pass
// rate stands out, an exercise that often limits one model, and most results countersigned with
// a few recent ones left in the review queue. Then the per-exercise insight rows of every result.
import { randomBytes, randomUUID } from 'node:crypto'
import { and, eq, inArray } from 'drizzle-orm'
import { findBuiltInProtocol, mulberry32, normalQuantile, resolvePassLevel } from '../../shared/utils/compute'
import type { PassLevelRuleSetKey } from '../../shared/utils/compute'
import { localDay } from '../../shared/utils/clock'
import { evaluateFitTest, storedFieldsOf } from '../../shared/utils/fit-test-evaluate'
import type { FitTestEntry } from '../../shared/utils/fit-test-schemas'
import { exerciseInsightRows } from '../../shared/utils/insight-rows'
import { hashPassword } from './hash'
import type { SeedDb, SeededOrganization } from './db'
import { schema } from './db'
import { insertCheck } from './equipment'

interface Scenario {
  /** Model and size that fits poorly. */
  poorFit: { model: string, size: string }
  /** Model that one exercise often limits, and that exercise's key. */
  limitedBy: { model: string, exerciseKey: string }
  drifting: { fullName: string, employeeNumber: string, model: string, size: string }
  extraTester: { displayName: string, email: string }
}

const SCENARIOS: Record<string, Scenario> = {
  'tamsin-valley': {
    poorFit: { model: 'CV-2 half mask', size: 'S' },
    limitedBy: { model: 'LW-11 half mask', exerciseKey: 'talking' },
    drifting: { fullName: 'Maren Tollbrook', employeeNumber: 'TV-2201', model: 'CV-7 full facepiece', size: 'M' },
    extraTester: { displayName: 'Piers Hallam', email: 'tester2@tamsin-valley.example' }
  },
  'harrow-point': {
    poorFit: { model: 'QP-12 CBRN full facepiece', size: 'S' },
    limitedBy: { model: 'FM-3 half mask', exerciseKey: 'bending-over' },
    drifting: { fullName: 'Idris Calloway', employeeNumber: 'HP-2207', model: 'QP-12 CBRN full facepiece', size: 'L' },
    extraTester: { displayName: 'Greta Wollaston', email: 'tester2@harrow-point.example' }
  }
}

const DAY = 86400_000

export async function seedInsights(db: SeedDb, orgs: SeededOrganization[], onProgress: (text: string) => void = () => {}) {
  const passwordHash = await hashPassword('sealwright-demo')
  for (const org of orgs) {
    const scenario = SCENARIOS[org.slug]
    if (!scenario) continue
    const random = mulberry32(org.slug === 'tamsin-valley' ? 7301 : 7302)
    const gauss = () => normalQuantile(Math.min(0.999999, Math.max(0.000001, random())))
    const [orgRow] = await db.select().from(schema.organizations).where(eq(schema.organizations.id, org.id))
    const sites = await db.select().from(schema.sites).where(eq(schema.sites.organizationId, org.id))
    const models = await db.select().from(schema.respiratorModels).where(eq(schema.respiratorModels.organizationId, org.id))
    const counters = await db.select().from(schema.counters).where(eq(schema.counters.organizationId, org.id))
    const people = await db.select().from(schema.people).where(eq(schema.people.organizationId, org.id))
    const byModel = (name: string) => models.find(m => m.model === name)!
    const [extraTester] = await db.insert(schema.users).values({ organizationId: org.id, email: scenario.extraTester.email, displayName: scenario.extraTester.displayName, role: 'tester', passwordHash }).returning()
    const [drifter] = await db.insert(schema.people).values({ organizationId: org.id, siteId: sites[0]!.id, fullName: scenario.drifting.fullName, employeeNumber: scenario.drifting.employeeNumber, jobTitle: 'Shift operator', medicalClearanceStatus: 'cleared', medicalClearanceOn: '2025-09-01' }).returning()

    const tests: (typeof schema.fitTests.$inferInsert)[] = []
    const cards: (typeof schema.fitCards.$inferInsert)[] = []
    const add = (o: { personId: string, modelName: string, size: string, at: Date, mu: number, testerId: string, weakExercise?: { key: string, offset: number } }) => {
      const model = byModel(o.modelName)
      const protocol = findBuiltInProtocol('osha-standard')!
      const exercises: FitTestEntry['exercises'] = protocol.exercises.filter(e => e.counted).map((e) => {
        const offset = o.weakExercise?.key === e.key ? o.weakExercise.offset : 0
        const ff = Math.max(1.5, Math.exp(o.mu + offset + 0.35 * gauss()))
        const before = Math.round(3000 + random() * 5000)
        const after = Math.round(before * (0.92 + 0.16 * random()))
        return { exerciseKey: e.key, ambientBefore: before, ambientAfter: after, ambientMean: null, inMask: Number((((before + after) / 2) / ff).toPrecision(3)), inMaskCount: null }
      })
      const entry: FitTestEntry = { mode: 'grid', exercises, wholeTestAmbient: null, seriesOffsetSeconds: 0, qualitative: null }
      const site = sites[0]!
      const counter = counters[0]!
      const level = resolvePassLevel({ ruleSet: orgRow!.ruleSet as PassLevelRuleSetKey, respiratorClass: model.respiratorClass, overrides: orgRow!.settings.passLevelOverrides })
      const { stored, evaluation } = storedFieldsOf({ kind: 'quantitative', protocol, entry, sampleFlowCm3PerMin: counter.sampleFlowCm3PerMin, passLevel: level.ok ? level.value.level : null, testedOn: localDay(o.at, site.timeZone), retestMonths: 12 })
      const recordId = randomUUID()
      tests.push({
        organizationId: org.id, recordId, revision: 1, status: 'finished', version: 2, personId: o.personId, siteId: site.id, testerUserId: o.testerId, counterId: counter.id,
        respiratorModelId: model.id, respiratorMake: model.make, respiratorModel: model.model, respiratorClass: model.respiratorClass, respiratorSize: o.size,
        kind: 'quantitative', protocolKey: protocol.key, protocol, sampleFlowCm3PerMin: counter.sampleFlowCm3PerMin, performedAt: o.at,
        preTest: { medicalClearanceCurrent: true, nothingCrossingSeal: true, userSealCheckDone: true, comfortAcceptable: true },
        entry, ...stored, evaluation, finishedAt: new Date(o.at.getTime() + 9 * 60_000), finishedByUserId: o.testerId
      })
      cards.push({ organizationId: org.id, recordId, token: randomBytes(24).toString('base64url') })
    }
    const now = Date.now()
    const level = (name: string) => (byModel(name).respiratorClass.includes('full') ? (orgRow!.ruleSet === 'uk-hse' ? 2000 : 500) : 100)
    // The drifting person: about 1.4× lower each year on the same facepiece, near the level now.
    const driftLevel = level(scenario.drifting.model)
    for (let i = 0; i < 4; i++) {
      add({ personId: drifter!.id, modelName: scenario.drifting.model, size: scenario.drifting.size, at: new Date(now - (3 - i) * 360 * DAY - 20 * DAY), mu: Math.log(driftLevel * 9) - i * 0.62, testerId: org.userIds.tester! })
    }
    // The poorly fitting size: people tried in it mostly fail at the first attempt.
    const sample = people.slice(1, 19)
    sample.forEach((p, i) => add({ personId: p.id, modelName: scenario.poorFit.model, size: scenario.poorFit.size, at: new Date(now - (40 + i * 37) * DAY), mu: Math.log(level(scenario.poorFit.model)) - 0.2 + 0.5 * gauss(), testerId: org.userIds.tester! }))
    // The model one exercise limits: tests that pass overall, with that exercise far below the rest.
    people.slice(19, 37).forEach((p, i) => add({ personId: p.id, modelName: scenario.limitedBy.model, size: 'M', at: new Date(now - (25 + i * 41) * DAY), mu: Math.log(level(scenario.limitedBy.model) * 12), weakExercise: { key: scenario.limitedBy.exerciseKey, offset: -1.6 }, testerId: org.userIds.tester! }))
    // The tester who stands out: many tests, fits checked loosely, far more fails than the organization.
    for (let i = 0; i < 60; i++) {
      const p = people[(i * 7) % people.length]!
      const name = models.filter(m => m.respiratorClass !== 'filtering-facepiece' && !m.respiratorClass.startsWith('scba'))[(i % 2)]!.model
      add({ personId: p.id, modelName: name, size: byModel(name).sizes[1] ?? byModel(name).sizes[0]!, at: new Date(now - (10 + i * 17) * DAY - 3 * 3600_000), mu: Math.log(level(name)) + 0.1 + 0.7 * gauss(), testerId: extraTester!.id })
    }
    for (let i = 0; i < tests.length; i += 100) {
      await db.insert(schema.fitTests).values(tests.slice(i, i + 100))
      await db.insert(schema.fitCards).values(cards.slice(i, i + 100))
    }
    await checkBeforeEachDay(db, org, tests.map(t => ({ counterId: t.counterId!, siteId: t.siteId, at: t.performedAt as Date })), sites[0]!.timeZone)
    onProgress(`${orgRow!.name}: ${tests.length} fit tests for insights, a second tester, a drifting fit`)
    await fillExerciseRows(db, org.id)
    await countersignOlder(db, org, now - 21 * DAY)
  }
}

/** A passing counter check 40 minutes before the first of these tests on each day, so they are covered. */
async function checkBeforeEachDay(db: SeedDb, org: SeededOrganization, tests: { counterId: string, siteId: string, at: Date }[], timeZone: string) {
  const [template] = await db.select().from(schema.readinessTemplates)
    .where(and(eq(schema.readinessTemplates.organizationId, org.id), eq(schema.readinessTemplates.scope, 'counter')))
  if (!template) return
  const first = new Map<string, { counterId: string, siteId: string, at: Date }>()
  for (const t of tests) {
    const key = `${t.counterId}|${localDay(t.at, timeZone)}`
    const known = first.get(key)
    if (!known || t.at < known.at) first.set(key, t)
  }
  for (const day of first.values()) await insertCheck(db, org, template, { counterId: day.counterId, siteId: day.siteId }, new Date(day.at.getTime() - 40 * 60_000))
}

/** Per-exercise insight rows of every finished revision, recomputed from the raw inputs. */
export async function fillExerciseRows(db: SeedDb, organizationId: string) {
  const t = schema.fitTests
  const rows = await db.select().from(t).where(and(eq(t.organizationId, organizationId), inArray(t.status, ['finished', 'superseded']), eq(t.kind, 'quantitative')))
  const values = rows.flatMap((row) => {
    if (!row.protocol || row.passLevel === null) return []
    const { result } = evaluateFitTest({ protocol: row.protocol, entry: row.entry, seriesText: row.seriesText, passLevel: row.passLevel, sampleFlowCm3PerMin: row.sampleFlowCm3PerMin })
    return exerciseInsightRows(row.organizationId, row.id, result)
  })
  for (let i = 0; i < values.length; i += 1000) {
    await db.insert(schema.fitTestExerciseResults).values(values.slice(i, i + 1000)).onConflictDoNothing()
  }
}

/** The reviewer countersigned everything older than `before`; recent results wait in the queue. */
async function countersignOlder(db: SeedDb, org: SeededOrganization, before: number) {
  const t = schema.fitTests
  const rows = await db.select({ id: t.id, recordId: t.recordId, performedAt: t.performedAt }).from(t).where(and(eq(t.organizationId, org.id), eq(t.status, 'finished')))
  const older = rows.filter(r => r.performedAt.getTime() < before)
  for (let i = 0; i < older.length; i += 500) {
    await db.insert(schema.countersigns).values(older.slice(i, i + 500).map(r => ({
      organizationId: org.id, fitTestId: r.id, recordId: r.recordId, signedByUserId: org.userIds.reviewer!, comment: null,
      signedAt: new Date(r.performedAt.getTime() + 5 * DAY)
    })))
  }
}
