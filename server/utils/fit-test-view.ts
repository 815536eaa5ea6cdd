import { and, eq } from 'drizzle-orm'
import { FIT_TEST_CAUTIONS, findRespiratorClass } from '#shared/utils/compute'
import type { Caller } from './auth'
import type { FitTestRow } from './fit-tests'
import { cardDecision, coverageFlagOf } from '#shared/utils/fit-card-rules'
import { recordCitations } from '#shared/utils/jurisdiction'

/** Everything the result page, the record and the card need about one revision. */
export async function fitTestView(caller: Caller, row: FitTestRow) {
  const db = useDb()
  const org = await findOrganization(caller.organizationId)
  const site = await findSite(caller.organizationId, row.siteId)
  const [person] = await db.select().from(schema.people).where(and(eq(schema.people.organizationId, caller.organizationId), eq(schema.people.id, row.personId)))
  const [tester] = await db.select({ displayName: schema.users.displayName }).from(schema.users).where(eq(schema.users.id, row.testerUserId))
  const [counter] = row.counterId
    ? await db.select().from(schema.counters).where(eq(schema.counters.id, row.counterId))
    : [null]
  const { evaluation } = computeStoredResult(row, org, site.timeZone)
  const [maskUnit] = row.maskUnitId
    ? await db.select({ id: schema.maskUnits.id, serialNumber: schema.maskUnits.serialNumber, state: schema.maskUnits.state }).from(schema.maskUnits).where(eq(schema.maskUnits.id, row.maskUnitId))
    : [null]
  const [revisions, card, coverage] = await Promise.all([
    listRevisions(caller.organizationId, row.recordId),
    findCard(caller.organizationId, row),
    row.counterId ? findCoverage(caller.organizationId, { counterId: row.counterId, siteId: row.siteId, performedAt: row.performedAt }) : null
  ])
  return {
    ...row,
    seriesText: row.status === 'draft' ? row.seriesText : null,
    hasSeries: Boolean(row.seriesText),
    person: person ? { id: person.id, fullName: person.fullName, employeeNumber: person.employeeNumber, jobTitle: person.jobTitle } : null,
    site: { id: site.id, name: site.name, timeZone: site.timeZone },
    testerName: tester?.displayName ?? 'Unknown',
    counter: counter ? { id: counter.id, serialNumber: counter.serialNumber, description: counter.description, sampleFlowCm3PerMin: counter.sampleFlowCm3PerMin, calibrationDueOn: counter.calibrationDueOn } : null,
    respiratorClassLabel: findRespiratorClass(row.respiratorClass)?.label ?? row.respiratorClass,
    organization: { name: org.name, ruleSet: org.ruleSet },
    result: evaluation?.result ?? null,
    seriesIssues: evaluation?.seriesIssues ?? [],
    revisions,
    coverage,
    // A verification link only for a revision that passed and was given a card; a failed test has none.
    cardToken: card && row.passed && row.status !== 'draft' ? card.token : null,
    card: cardDecision({ status: row.status, passed: row.passed, coverage: coverageFlagOf(coverage), uncoveredResults: org.settings.uncoveredResults }),
    coverageFlag: coverageFlagOf(coverage),
    citations: recordCitations(org.ruleSet),
    maskUnit,
    cautions: FIT_TEST_CAUTIONS
  }
}
export type FitTestView = Awaited<ReturnType<typeof fitTestView>>

/** Tester, reviewer and trainer read every record; a wearer only their own. */
export async function assertMayRead(caller: Caller, row: FitTestRow) {
  if (caller.role !== 'wearer') return
  const [person] = await useDb().select({ userId: schema.people.userId }).from(schema.people).where(eq(schema.people.id, row.personId))
  if (person?.userId !== caller.id) {
    throw httpError(404, 'No such fit test in your organization.')
  }
}
