// Demo people, catalogue and about 150 fit tests per organization over three years, with
// log-normally spread fit factors and failures followed by a retest in another size or model.
// Everything here is invented.
import { randomBytes, randomUUID } from 'node:crypto'
import { and, eq } from 'drizzle-orm'
import { BUILT_IN_PROTOCOLS, findBuiltInProtocol, mulberry32, normalQuantile, resolvePassLevel } from '../../shared/utils/compute'
import type { PassLevelRuleSetKey, Protocol } from '../../shared/utils/compute'
import { localDay } from '../../shared/utils/clock'
import { storedFieldsOf } from '../../shared/utils/fit-test-evaluate'
import type { FitTestEntry } from '../../shared/utils/fit-test-schemas'
import type { SeedDb, SeededOrganization } from './db'
import { schema } from './db'
import { insertCheck } from './equipment'

const FIRST = ['Ada', 'Bram', 'Cleo', 'Dara', 'Emrys', 'Fenna', 'Gethin', 'Hollis', 'Ines', 'Jory', 'Kit', 'Linnea', 'Marek', 'Nell', 'Oren', 'Perrin', 'Quill', 'Rhian', 'Soren', 'Tove', 'Ulla', 'Vance', 'Wren', 'Yara', 'Zeb', 'Anouk', 'Bastian', 'Corin', 'Delphine', 'Eamon']
const LAST = ['Ashdown', 'Brackley', 'Carrow', 'Dunmere', 'Elston', 'Fairlie', 'Garside', 'Hartwell', 'Ivesley', 'Jessop', 'Kellow', 'Lanyon', 'Marrick', 'Northam', 'Orwin', 'Penhale', 'Quarles', 'Rusholme', 'Stanier', 'Tregear', 'Upcott', 'Varley', 'Whitlow', 'Yelland']
const JOBS: Record<string, string[]> = {
  'tamsin-valley': ['Treatment operator', 'Chlorine handler', 'Maintenance fitter', 'Laboratory technician', 'Pump station technician', 'Sludge operator'],
  'harrow-point': ['Firefighter', 'Crew commander', 'Hazmat officer', 'Watch manager', 'Breathing apparatus instructor', 'Decontamination operative']
}
const CATALOGUE: Record<string, { make: string, model: string, respiratorClass: string, sizes: string[] }[]> = {
  'tamsin-valley': [
    { make: 'Corvid Safety', model: 'CV-2 half mask', respiratorClass: 'elastomeric-half-mask', sizes: ['S', 'M', 'L'] },
    { make: 'Corvid Safety', model: 'CV-7 full facepiece', respiratorClass: 'elastomeric-full-facepiece', sizes: ['S', 'M', 'L'] },
    { make: 'Larkspur Works', model: 'LW-11 half mask', respiratorClass: 'elastomeric-half-mask', sizes: ['S', 'M', 'L'] },
    { make: 'Larkspur Works', model: 'LW-30 filtering facepiece', respiratorClass: 'filtering-facepiece', sizes: ['Small', 'Regular'] }
  ],
  // The brigade's full facepieces are the models of its mask units (scripts/seed/equipment.ts).
  'harrow-point': [
    { make: 'Quillon Protective', model: 'QP-12 CBRN full facepiece', respiratorClass: 'elastomeric-full-facepiece', sizes: ['S', 'M', 'L'] },
    { make: 'Ostler Breathing', model: 'OB-2 breathing-apparatus facepiece', respiratorClass: 'scba-pressure-demand-full-facepiece', sizes: ['S', 'M', 'L'] },
    { make: 'Fenmoor', model: 'FM-3 half mask', respiratorClass: 'elastomeric-half-mask', sizes: ['S', 'M', 'L'] }
  ]
}
// Exercises that break the seal more often sit lower (log-scale offsets, invented for the demo).
const EXERCISE_OFFSET: Record<string, number> = { 'talking': -0.5, 'bending-over': -0.6, 'bending': -0.6, 'head-side-to-side': -0.3, 'jogging-in-place': -0.4, 'deep-breathing': -0.2 }

export async function seedFitTests(db: SeedDb, orgs: SeededOrganization[], onProgress: (text: string) => void) {
  for (const org of orgs) {
    const random = mulberry32(org.slug === 'tamsin-valley' ? 20240101 : 20240202)
    const gauss = () => normalQuantile(Math.min(0.999999, Math.max(0.000001, random())))
    const pick = <T>(list: readonly T[]) => list[Math.floor(random() * list.length)]!
    const [orgRow] = await db.select().from(schema.organizations).where(eq(schema.organizations.id, org.id))
    const sites = await db.select().from(schema.sites).where(eq(schema.sites.organizationId, org.id))
    await db.insert(schema.respiratorModels).values(CATALOGUE[org.slug]!.map(m => ({ ...m, organizationId: org.id }))).onConflictDoNothing()
    const models = (await db.select().from(schema.respiratorModels).where(eq(schema.respiratorModels.organizationId, org.id)))
      .filter(m => CATALOGUE[org.slug]!.some(c => c.model === m.model))
    let counters = await db.select().from(schema.counters).where(eq(schema.counters.organizationId, org.id))
    if (counters.length === 0) {
      counters = await db.insert(schema.counters).values({ organizationId: org.id, siteId: sites[0]!.id, serialNumber: `${org.slug.slice(0, 2).toUpperCase()}-PC-0101`, description: 'Particle counter (demo)', sampleFlowCm3PerMin: 350, calibrationDueOn: '2027-03-31' }).returning()
    }
    onProgress(`${orgRow!.name}: 40 people`)
    const people = await db.insert(schema.people).values(Array.from({ length: 40 }, (_, i) => ({
      organizationId: org.id,
      siteId: sites[i % sites.length]!.id,
      userId: i === 0 ? org.userIds.wearer ?? null : null,
      fullName: i === 0 ? (org.slug === 'tamsin-valley' ? 'Jonah Marsh' : 'Elin Moss') : `${FIRST[(i * 7) % FIRST.length]} ${LAST[(i * 11) % LAST.length]}`,
      employeeNumber: `${org.slug === 'tamsin-valley' ? 'TV' : 'HP'}-${String(1040 + i * 3)}`,
      jobTitle: pick(JOBS[org.slug]!),
      medicalClearanceStatus: (i % 13 === 5 ? 'pending' : 'cleared') as 'pending' | 'cleared',
      medicalClearanceOn: i % 13 === 5 ? null : `2025-${String(1 + (i % 12)).padStart(2, '0')}-15`
    }))).returning()

    const now = Date.now()
    const threeYears = 3 * 365 * 86400_000
    const rows: TestRows[] = []
    for (const person of people) {
      const site = sites.find(s => s.id === person.siteId)!
      // Each wearer has a personal fit quality: most fit well, a few struggle (log-normal spread).
      const personMu = Math.log(person === people[0] ? 1500 : 900) + 0.9 * gauss()
      let model = pick(models.filter(m => m.respiratorClass !== 'filtering-facepiece'))
      let size = model.sizes[Math.min(model.sizes.length - 1, Math.floor(random() * model.sizes.length))]!
      let at = now - threeYears + random() * 240 * 86400_000
      while (at < now - 5 * 86400_000) {
        let attempt = 0
        let passed = false
        while (!passed && attempt < 3) {
          const performedAt = new Date(at + attempt * 25 * 60_000)
          const row = buildTest({ org, orgRow: orgRow!, person, site, model, size, counter: pick(counters), performedAt, mu: personMu + (attempt * 0.9) + (size === model.sizes[1] ? 0.2 : 0), gauss, random })
          rows.push(row)
          passed = Boolean(row.test.passed)
          if (!passed) {
            // Retest after a refit: another size, or on the second failure another model.
            const sizes = model.sizes.filter(s => s !== size)
            if (attempt === 0 && sizes.length) size = pick(sizes)
            else model = pick(models.filter(m => m.id !== model.id && m.respiratorClass !== 'filtering-facepiece'))
            if (!model.sizes.includes(size)) size = model.sizes[Math.floor(model.sizes.length / 2)]!
          }
          attempt++
        }
        at += (330 + random() * 30) * 86400_000
      }
    }
    await coverTestDays(db, org, rows, sites, random)
    for (let i = 0; i < rows.length; i += 100) {
      await db.insert(schema.fitTests).values(rows.slice(i, i + 100).map(r => r.test))
      // Only a passing test has a card (and so a verification link).
      const cards = rows.slice(i, i + 100).flatMap(r => (r.card ? [r.card] : []))
      if (cards.length) await db.insert(schema.fitCards).values(cards)
    }
    onProgress(`${orgRow!.name}: ${rows.length} fit tests, each day's counter check before them`)
  }
}

/**
 * A passing readiness check of the counter before the first test of each test day, so the
 * demo's records are covered; about one day in forty is left without one, to show the flag.
 */
async function coverTestDays(db: SeedDb, org: SeededOrganization, rows: TestRows[], sites: (typeof schema.sites.$inferSelect)[], random: () => number) {
  const [template] = await db.select().from(schema.readinessTemplates)
    .where(and(eq(schema.readinessTemplates.organizationId, org.id), eq(schema.readinessTemplates.scope, 'counter')))
  if (!template) return
  const firstOfDay = new Map<string, { counterId: string, siteId: string, at: Date }>()
  for (const { test } of rows) {
    const site = sites.find(s => s.id === test.siteId)!
    const key = `${test.counterId}|${localDay(test.performedAt, site.timeZone)}`
    const known = firstOfDay.get(key)
    if (!known || test.performedAt < known.at) firstOfDay.set(key, { counterId: test.counterId!, siteId: site.id, at: test.performedAt })
  }
  for (const day of firstOfDay.values()) {
    if (random() < 0.025) continue
    await insertCheck(db, org, template, { counterId: day.counterId, siteId: day.siteId }, new Date(day.at.getTime() - 40 * 60_000))
  }
}

interface TestRows {
  test: typeof schema.fitTests.$inferInsert & { performedAt: Date }
  card: typeof schema.fitCards.$inferInsert | null
}

interface TestSpec {
  org: SeededOrganization
  orgRow: typeof schema.organizations.$inferSelect
  person: typeof schema.people.$inferSelect
  site: typeof schema.sites.$inferSelect
  model: typeof schema.respiratorModels.$inferSelect
  size: string
  counter: typeof schema.counters.$inferSelect
  performedAt: Date
  mu: number
  gauss: () => number
  random: () => number
}

function buildTest(s: TestSpec): TestRows {
  const ruleSet = s.orgRow.ruleSet as PassLevelRuleSetKey
  const modifiedKey = s.model.respiratorClass === 'elastomeric-half-mask' || s.model.respiratorClass === 'elastomeric-full-facepiece' ? 'osha-modified-elastomeric' : 'osha-standard'
  const protocol: Protocol = findBuiltInProtocol(ruleSet === 'us-osha' && s.random() < 0.3 ? modifiedKey : 'osha-standard') ?? BUILT_IN_PROTOCOLS[0]!
  const ambient = () => Math.round(2500 + s.random() * 7000)
  const start = ambient()
  const end = Math.round(start * (0.9 + 0.2 * s.random()))
  const wholeTest = protocol.ambientPlan === 'whole-test'
  // Full facepieces seal on a larger, flatter band of the face and reach higher factors.
  const fullFaceBonus = s.model.respiratorClass.includes('full-facepiece') ? 1.6 : 0
  const exercises: FitTestEntry['exercises'] = protocol.exercises.filter(e => e.counted).map((e) => {
    const ff = Math.max(1.2, Math.exp(s.mu + fullFaceBonus + (EXERCISE_OFFSET[e.key] ?? 0) + 0.45 * s.gauss()))
    const before = wholeTest ? null : ambient()
    const after = before === null ? null : Math.round(before * (0.9 + 0.2 * s.random()))
    const mean = before === null ? (start + end) / 2 : (before + after!) / 2
    return { exerciseKey: e.key, ambientBefore: before, ambientAfter: after, ambientMean: null, inMask: Number((mean / ff).toPrecision(3)), inMaskCount: null }
  })
  const entry: FitTestEntry = { mode: 'grid', exercises, wholeTestAmbient: wholeTest ? { start, end } : null, seriesOffsetSeconds: 0, qualitative: null }
  const level = resolvePassLevel({ ruleSet, respiratorClass: s.model.respiratorClass, overrides: s.orgRow.settings.passLevelOverrides })
  const { stored, evaluation } = storedFieldsOf({ kind: 'quantitative', protocol, entry, sampleFlowCm3PerMin: s.counter.sampleFlowCm3PerMin, passLevel: level.ok ? level.value.level : null, testedOn: localDay(s.performedAt, s.site.timeZone), retestMonths: 12 })
  const recordId = randomUUID()
  const id = randomUUID()
  return {
    test: {
      id, organizationId: s.org.id, recordId, revision: 1, status: 'finished', version: 2,
      personId: s.person.id, siteId: s.site.id, testerUserId: s.org.userIds.tester!, counterId: s.counter.id,
      respiratorModelId: s.model.id, respiratorMake: s.model.make, respiratorModel: s.model.model, respiratorClass: s.model.respiratorClass, respiratorSize: s.size,
      kind: 'quantitative', protocolKey: protocol.key, protocol, sampleFlowCm3PerMin: s.counter.sampleFlowCm3PerMin, performedAt: s.performedAt,
      preTest: { medicalClearanceCurrent: true, nothingCrossingSeal: true, userSealCheckDone: true, comfortAcceptable: true },
      entry, ...stored, evaluation, finishedAt: new Date(s.performedAt.getTime() + 9 * 60_000), finishedByUserId: s.org.userIds.tester!
    },
    card: stored.passed ? { organizationId: s.org.id, recordId, fitTestId: id, token: randomBytes(24).toString('base64url') } : null
  }
}
