import { eq } from 'drizzle-orm'
import { FIT_TEST_CAUTIONS, findRespiratorClass } from '#shared/utils/compute'
import { decideCoverage } from '#shared/utils/coverage'
import type { Caller } from './auth'
import type { Evaluation } from '#shared/utils/fit-test-evaluate'
import type { FitTestRow } from './fit-tests'
import type { FitTestRecord } from './fit-test-record'
import { cardDecision, coverageFlagOf } from '#shared/utils/fit-card-rules'
import { recordCitations } from '#shared/utils/jurisdiction'

/**
 * Everything the result page, the record and the card need about one revision: one query for the
 * record and its relations (the organization was read with the caller). A wearer reads only
 * their own records; to anyone else another's is the same 404 as a missing one.
 */
export async function fitTestView(caller: Caller, rowOrId: FitTestRow | string) {
  const record = await loadFitTestRecord(caller.organizationId, typeof rowOrId === 'string' ? rowOrId : rowOrId.id)
  if (caller.role === 'wearer' && record.person?.userId !== caller.id) {
    throw httpError(404, 'No such fit test in your organization.')
  }
  return viewOf(record, await findOrganization(caller.organizationId))
}

function viewOf(record: FitTestRecord, org: Awaited<ReturnType<typeof findOrganization>>) {
  const { test: row, site, person, counter } = record
  const evaluation = resultOf(row, org, site.timeZone)
  const coverage = row.counterId
    ? decideCoverage({ counterId: row.counterId, benchRigId: null, performedAt: row.performedAt, timeZone: site.timeZone }, record.coverageChecks, counter ? { calibrationDueOn: counter.calibrationDueOn } : null)
    : null
  const card = cardOf(record)
  return {
    ...fitTestFields(row),
    seriesText: row.status === 'draft' ? row.seriesText : null,
    hasSeries: record.hasSeries,
    person: person ? { id: person.id, fullName: person.fullName, employeeNumber: person.employeeNumber, jobTitle: person.jobTitle } : null,
    site,
    testerName: record.testerName ?? 'Unknown',
    counter,
    respiratorClassLabel: findRespiratorClass(row.respiratorClass)?.label ?? row.respiratorClass,
    organization: { name: org.name, ruleSet: org.ruleSet },
    result: evaluation?.result ?? null,
    seriesIssues: evaluation?.seriesIssues ?? [],
    revisions: record.revisions,
    coverage,
    // A verification link only for a revision that passed and was given a card; a failed test has none.
    cardToken: card && row.passed && row.status !== 'draft' ? card.token : null,
    card: cardDecision({ status: row.status, passed: row.passed, coverage: coverageFlagOf(coverage), uncoveredResults: org.settings.uncoveredResults }),
    coverageFlag: coverageFlagOf(coverage),
    citations: recordCitations(org.ruleSet),
    maskUnit: record.maskUnit,
    cautions: FIT_TEST_CAUTIONS
  }
}
export type FitTestView = ReturnType<typeof viewOf>

/**
 * A finished revision's result as stored when it was finished (never re-parsed from its series);
 * a draft, or a row loaded before results were stored, is recomputed from its raw inputs.
 */
function resultOf(row: FitTestRow, org: Awaited<ReturnType<typeof findOrganization>>, timeZone: string) {
  if (row.status !== 'draft' && row.evaluation) return row.evaluation
  return computeStoredResult(row, org, timeZone).evaluation
}

/** Tester, reviewer and trainer read every record; a wearer only their own. */
export async function assertMayRead(caller: Caller, row: FitTestRow) {
  if (caller.role !== 'wearer') return
  const [person] = await useDb().select({ userId: schema.people.userId }).from(schema.people).where(eq(schema.people.id, row.personId))
  if (person?.userId !== caller.id) {
    throw httpError(404, 'No such fit test in your organization.')
  }
}

/**
 * What a draft save answers: the saved revision with its new version and recomputed result, but
 * not the series the client has just sent, nor the relations it already shows.
 */
export function draftSaved(row: FitTestRow, evaluation: Evaluation | null) {
  return { ...fitTestFields(row), hasSeries: Boolean(row.seriesText), result: evaluation?.result ?? null, seriesIssues: evaluation?.seriesIssues ?? [] }
}

/**
 * A revision's own fields as a route sends them: never the organization, the idempotency key, the
 * stored evaluation (the result goes beside it) or the raw series (each caller decides).
 */
function fitTestFields(row: FitTestRow) {
  return {
    id: row.id, recordId: row.recordId, revision: row.revision, revisionReason: row.revisionReason, status: row.status, version: row.version,
    personId: row.personId, siteId: row.siteId, counterId: row.counterId, maskUnitId: row.maskUnitId,
    respiratorModelId: row.respiratorModelId, respiratorMake: row.respiratorMake, respiratorModel: row.respiratorModel,
    respiratorClass: row.respiratorClass, respiratorSize: row.respiratorSize,
    kind: row.kind, protocolKey: row.protocolKey, protocol: row.protocol, sampleFlowCm3PerMin: row.sampleFlowCm3PerMin,
    performedAt: row.performedAt, preTest: row.preTest, entry: row.entry, seriesSha256: row.seriesSha256,
    passLevel: row.passLevel, overallFitFactor: row.overallFitFactor, overallIsLowerBound: row.overallIsLowerBound, passed: row.passed,
    limitingExerciseKey: row.limitingExerciseKey, dueOn: row.dueOn, finishedAt: row.finishedAt,
    withdrawnReason: row.withdrawnReason, discardedReason: row.discardedReason, retestOfRecordId: row.retestOfRecordId, clearanceAtStart: row.clearanceAtStart
  }
}
