import { and, eq } from 'drizzle-orm'
import { FIT_TEST_CAUTIONS, findRespiratorClass } from '#shared/utils/compute'
import type { Caller } from './auth'
import type { FitTestRow } from './fit-tests'

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
  const [revisions, card, coverage] = await Promise.all([
    listRevisions(caller.organizationId, row.recordId),
    findCard(caller.organizationId, row.recordId),
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
    cardToken: card && (row.status === 'finished' || row.status === 'withdrawn') ? card.token : null,
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
