import { and, eq, getTableColumns, sql } from 'drizzle-orm'
import type { FitTestRow } from './fit-tests'

const t = schema.fitTests
const DAY = sql.raw('interval \'2 days\'')

type RevisionSummary = { id: string, revision: number, status: FitTestRow['status'], revisionReason: string | null, finishedAt: Date | null, createdAt: Date }
interface CoverageCheck { id: string, counterId: string, benchRigId: string | null, status: string, completedAt: Date | null }

const asDate = (value: string | null) => (value === null ? null : new Date(value))

/**
 * One revision with everything its page shows, in a single round trip: site, person, tester,
 * counter, mask unit, the record's revisions and cards, which revision the record stands on, and
 * what coverage needs (the counter's calibration and the readiness checks within two days).
 * "Missing" and "not yours" are the same 404.
 */
export async function loadFitTestRecord(organizationId: string, id: string) {
  const [found] = await recordStatement().execute({ organizationId, id })
  if (!found) throw httpError(404, 'No such fit test in your organization.')
  if (!found.site) throw httpError(404, 'No such site.')
  return { ...found, site: found.site }
}
export type FitTestRecord = Awaited<ReturnType<typeof loadFitTestRecord>>

const recordStatement = preparedRead((db) => {
  const p = schema.people
  const c = schema.counters
  const m = schema.maskUnits
  return db.select({
    // A finished revision's page reads its stored result, so its series (often the largest field)
    // is read only for a draft, or for a result stored before results were (recomputed from it).
    test: { ...getTableColumns(t), seriesText: sql<string | null>`case when ${t.status} = 'draft' or ${t.evaluation} is null then ${t.seriesText} end` },
    hasSeries: sql<boolean>`${t.seriesText} is not null`,
    site: { id: schema.sites.id, name: schema.sites.name, timeZone: schema.sites.timeZone },
    person: { id: p.id, fullName: p.fullName, employeeNumber: p.employeeNumber, jobTitle: p.jobTitle, userId: p.userId },
    testerName: schema.users.displayName,
    counter: { id: c.id, serialNumber: c.serialNumber, description: c.description, sampleFlowCm3PerMin: c.sampleFlowCm3PerMin, calibrationDueOn: c.calibrationDueOn },
    maskUnit: { id: m.id, serialNumber: m.serialNumber, state: m.state },
    revisions: sql<RevisionSummary[]>`(select coalesce(json_agg(json_build_object('id', r.id, 'revision', r.revision, 'status', r.status,
        'revisionReason', r.revision_reason, 'finishedAt', r.finished_at, 'createdAt', r.created_at) order by r.revision), '[]'::json)
      from fit_tests r where r.organization_id = ${t.organizationId} and r.record_id = ${t.recordId})`
      .mapWith(rows => (rows as (RevisionSummary & { finishedAt: string | null, createdAt: string })[])
        .map(r => ({ ...r, finishedAt: asDate(r.finishedAt), createdAt: new Date(r.createdAt) }))),
    cards: sql<{ fitTestId: string | null, token: string }[]>`(select coalesce(json_agg(json_build_object('fitTestId', k.fit_test_id, 'token', k.token)), '[]'::json)
      from fit_cards k where k.organization_id = ${t.organizationId} and k.record_id = ${t.recordId})`,
    // The revision a record stands on now: the finished (or withdrawn) one, else the newest.
    currentRevisionId: sql<string | null>`(select r.id from fit_tests r where r.organization_id = ${t.organizationId} and r.record_id = ${t.recordId}
      order by (r.status in ('finished', 'withdrawn')) desc, r.revision desc limit 1)`,
    coverageChecks: sql<CoverageCheck[]>`(select coalesce(json_agg(json_build_object('id', k.id, 'counterId', k.counter_id, 'benchRigId', k.bench_rig_id,
        'status', k.status, 'completedAt', k.completed_at)), '[]'::json)
      from readiness_checks k where ${t.counterId} is not null and k.organization_id = ${t.organizationId}
        and k.completed_at between ${t.performedAt} - ${DAY} and ${t.performedAt} + ${DAY})`
      .mapWith(rows => (rows as (CoverageCheck & { completedAt: string | null })[]).map(k => ({ ...k, completedAt: asDate(k.completedAt) })))
  })
    .from(t)
    .leftJoin(schema.sites, and(eq(schema.sites.id, t.siteId), eq(schema.sites.organizationId, t.organizationId)))
    .leftJoin(p, and(eq(p.id, t.personId), eq(p.organizationId, t.organizationId)))
    .leftJoin(schema.users, eq(schema.users.id, t.testerUserId))
    .leftJoin(c, and(eq(c.id, t.counterId), eq(c.organizationId, t.organizationId)))
    .leftJoin(m, eq(m.id, t.maskUnitId))
    .where(and(eq(t.organizationId, sql.placeholder('organizationId')), eq(t.id, sql.placeholder('id'))))
    .prepare('fit_test_record')
})

/**
 * The card printed for this revision: its own, or — for cards made before each revision had one —
 * the record's card when this revision is the one the record stands on.
 */
export function cardOf(record: Pick<FitTestRecord, 'test' | 'cards' | 'currentRevisionId'>) {
  const own = record.cards.find(card => card.fitTestId === record.test.id)
  if (own) return own
  const legacy = record.cards.find(card => card.fitTestId === null)
  return legacy && record.currentRevisionId === record.test.id ? legacy : null
}
