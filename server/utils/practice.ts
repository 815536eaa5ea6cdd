import { and, count, desc, eq } from 'drizzle-orm'
import { FIT_TEST_CAUTIONS, findRespiratorClass } from '#shared/utils/compute'
import type { Protocol } from '#shared/utils/compute'
import { evaluateFitTest } from '#shared/utils/fit-test-evaluate'
import type { FitTestEntry } from '#shared/utils/fit-test-schemas'

function notFound(what: string): never {
  throw httpError(404, `No such ${what} in your organization.`)
}

export async function findPracticeSet(organizationId: string, id: string) {
  const t = schema.practiceSets
  const [row] = await useDb().select().from(t).where(and(eq(t.organizationId, organizationId), eq(t.id, id)))
  return row ?? notFound('practice set')
}

export async function findPracticePerson(organizationId: string, id: string) {
  const t = schema.practicePeople
  const [row] = await useDb().select().from(t).where(and(eq(t.organizationId, organizationId), eq(t.id, id)))
  return row ?? notFound('practice person')
}

export async function findPracticeTest(organizationId: string, id: string): Promise<PracticeTestRow> {
  const t = schema.practiceTests
  const [row] = await useDb().select().from(t).where(and(eq(t.organizationId, organizationId), eq(t.id, id)))
  return row ?? notFound('practice test')
}

/** Sets with how much practice each holds, newest first. */
export async function listPracticeSets(organizationId: string) {
  const db = useDb()
  const sets = await db.select().from(schema.practiceSets).where(eq(schema.practiceSets.organizationId, organizationId)).orderBy(desc(schema.practiceSets.createdAt))
  const people = await db.select({ setId: schema.practicePeople.practiceSetId, n: count() }).from(schema.practicePeople).where(eq(schema.practicePeople.organizationId, organizationId)).groupBy(schema.practicePeople.practiceSetId)
  const tests = await db.select({ setId: schema.practiceTests.practiceSetId, n: count() }).from(schema.practiceTests).where(eq(schema.practiceTests.organizationId, organizationId)).groupBy(schema.practiceTests.practiceSetId)
  const of = (rows: { setId: string, n: number }[], id: string) => rows.find(r => r.setId === id)?.n ?? 0
  return sets.map(s => ({ ...practiceSetView(s), people: of(people, s.id), tests: of(tests, s.id) }))
}

/** What a route sends for a practice set: never the organization or who created it. */
export function practiceSetView(row: PracticeSetRow) {
  return { id: row.id, name: row.name, createdAt: row.createdAt }
}

/** What a route sends for a practice person. */
export function practicePersonView(row: PracticePersonRow) {
  return { id: row.id, practiceSetId: row.practiceSetId, fullName: row.fullName }
}

/** The server's own result for a practice test, from the raw inputs only (the same path as a real test). */
export function evaluatePractice(row: Pick<PracticeTestRow, 'protocol' | 'entry' | 'seriesText' | 'passLevel' | 'sampleFlowCm3PerMin'>) {
  const evaluation = evaluateFitTest({ protocol: row.protocol as Protocol, entry: row.entry as FitTestEntry, seriesText: row.seriesText, passLevel: row.passLevel, sampleFlowCm3PerMin: row.sampleFlowCm3PerMin })
  const r = evaluation.result
  return {
    evaluation,
    stored: { overallFitFactor: r.ok ? r.overall.value : null, overallIsLowerBound: r.ok ? r.overall.isLowerBound : null, passed: r.ok ? r.pass : null }
  }
}

export async function practiceTestView(organizationId: string, row: PracticeTestRow) {
  const db = useDb()
  const person = await findPracticePerson(organizationId, row.practicePersonId)
  const set = await findPracticeSet(organizationId, row.practiceSetId)
  const [trainee] = await db.select({ displayName: schema.users.displayName }).from(schema.users).where(eq(schema.users.id, row.traineeUserId))
  const org = await findOrganization(organizationId)
  const { evaluation } = evaluatePractice(row)
  return {
    id: row.id,
    practiceSetId: row.practiceSetId,
    practicePersonId: row.practicePersonId,
    status: row.status,
    version: row.version,
    respiratorClass: row.respiratorClass,
    protocolKey: row.protocolKey,
    protocol: row.protocol,
    sampleFlowCm3PerMin: row.sampleFlowCm3PerMin,
    entry: row.entry,
    seriesText: row.seriesText,
    passLevel: row.passLevel,
    overallFitFactor: row.overallFitFactor,
    overallIsLowerBound: row.overallIsLowerBound,
    passed: row.passed,
    finishedAt: row.finishedAt,
    createdAt: row.createdAt,
    practice: true as const,
    person: { id: person.id, fullName: person.fullName },
    set: { id: set.id, name: set.name },
    traineeName: trainee?.displayName ?? 'Unknown',
    respiratorClassLabel: findRespiratorClass(row.respiratorClass)?.label ?? row.respiratorClass,
    organization: { ruleSet: org.ruleSet },
    result: evaluation.result,
    seriesIssues: evaluation.seriesIssues,
    cautions: FIT_TEST_CAUTIONS
  }
}

/** Exercise keys in an entry must be the protocol's own. */
export function assertEntryFits(protocol: Protocol, entry: FitTestEntry | undefined) {
  if (!entry) return
  const keys = new Set(protocol.exercises.map(e => e.key))
  const stranger = entry.exercises.find(e => !keys.has(e.exerciseKey))
  if (stranger) {
    throw httpError(400, 'Check the results: an exercise does not belong to this protocol.', { fieldErrors: { entry: 'An exercise does not belong to this protocol.' } })
  }
  if (entry.mode === 'qualitative') {
    throw httpError(400, 'Practice tests are quantitative: type per exercise or paste a count series.', { fieldErrors: { 'entry.mode': 'Choose grid or series.' } })
  }
}

export function practiceStaleError() {
  return httpError(409, 'This practice test was saved elsewhere after you opened it. Reload to see the newer version; your typing is still on screen.')
}
