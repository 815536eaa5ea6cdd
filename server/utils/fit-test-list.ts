import { and, asc, count, desc, eq, gte, ilike, isNotNull, lt, ne, or, sql } from 'drizzle-orm'
import type { SQL } from 'drizzle-orm'
import type { ListFitTestsQuery } from '#shared/utils/fit-test-schemas'

const t = schema.fitTests
const p = schema.people

export function listConditions(organizationId: string, q: Omit<ListFitTestsQuery, 'page' | 'pageSize' | 'sort' | 'dir'>, onlyPersonUserId?: string) {
  const where: (SQL | undefined)[] = [
    eq(t.organizationId, organizationId),
    // One line per record: superseded revisions and open corrections stay on the record's own page.
    ne(t.status, 'superseded'),
    ne(t.status, 'discarded'),
    or(ne(t.status, 'draft'), eq(t.revision, 1))
  ]
  if (onlyPersonUserId) where.push(eq(p.userId, onlyPersonUserId))
  if (q.personId) where.push(eq(t.personId, q.personId))
  if (q.siteId) where.push(eq(t.siteId, q.siteId))
  if (q.kind) where.push(eq(t.kind, q.kind))
  if (q.result === 'pass') where.push(eq(t.status, 'finished'), eq(t.passed, true))
  if (q.result === 'fail') where.push(eq(t.status, 'finished'), eq(t.passed, false))
  if (q.result === 'draft') where.push(eq(t.status, 'draft'))
  if (q.result === 'withdrawn') where.push(eq(t.status, 'withdrawn'))
  if (q.from) where.push(gte(t.performedAt, new Date(`${q.from}T00:00:00Z`)))
  if (q.to) where.push(lt(t.performedAt, sql`(${q.to}::date + 1)::timestamptz`))
  if (q.q) {
    const like = `%${q.q.replace(/[%_\\]/g, m => `\\${m}`)}%`
    where.push(or(ilike(p.fullName, like), ilike(p.employeeNumber, like), ilike(t.respiratorModel, like), ilike(t.respiratorMake, like)))
  }
  return and(...where)
}

/** What one line of a fit-test list shows (the joins are in `listFitTests`). */
export const listColumns = {
  id: t.id,
  recordId: t.recordId,
  revision: t.revision,
  status: t.status,
  kind: t.kind,
  performedAt: t.performedAt,
  personId: t.personId,
  siteId: t.siteId,
  counterId: t.counterId,
  personName: p.fullName,
  employeeNumber: p.employeeNumber,
  siteName: schema.sites.name,
  siteTimeZone: schema.sites.timeZone,
  respiratorMake: t.respiratorMake,
  respiratorModel: t.respiratorModel,
  respiratorClass: t.respiratorClass,
  respiratorSize: t.respiratorSize,
  protocolKey: t.protocolKey,
  counterSerial: schema.counters.serialNumber,
  overallFitFactor: t.overallFitFactor,
  overallIsLowerBound: t.overallIsLowerBound,
  passLevel: t.passLevel,
  passed: t.passed,
  limitingExerciseKey: t.limitingExerciseKey,
  dueOn: t.dueOn,
  testerName: schema.users.displayName
}

export async function listFitTests(organizationId: string, q: ListFitTestsQuery, onlyPersonUserId?: string) {
  const where = listConditions(organizationId, q, onlyPersonUserId)
  const order = q.dir === 'asc' ? asc : desc
  const sortColumn = q.sort === 'person' ? p.fullName : q.sort === 'overallFitFactor' ? t.overallFitFactor : t.performedAt
  // The page and its total in one round trip (the total is an uncorrelated subquery, run once).
  // The count joins people only when a filter reads them (every record has its person).
  const counted = () => {
    const from = useDb().select({ n: count() }).from(t)
    return (q.q || onlyPersonUserId ? from.innerJoin(p, eq(p.id, t.personId)) : from).where(where)
  }
  const totalOf = sql<number>`(${counted()})`.mapWith(Number)
  const found = await useDb().select({ ...listColumns, total: totalOf }).from(t)
    .innerJoin(p, eq(p.id, t.personId))
    .innerJoin(schema.sites, eq(schema.sites.id, t.siteId))
    .innerJoin(schema.users, eq(schema.users.id, t.testerUserId))
    .leftJoin(schema.counters, eq(schema.counters.id, t.counterId))
    .where(where).orderBy(order(sortColumn), desc(t.performedAt)).limit(q.pageSize).offset((q.page - 1) * q.pageSize)
  const rows = found.map(({ total: _total, ...row }) => row)
  // A page past the end has no row to carry the total.
  const total = found[0]?.total ?? (q.page > 1 ? (await counted())[0]?.n ?? 0 : 0)
  const coverage = await findCoverageMany(organizationId, rows)
  return { rows: rows.map(r => ({ ...r, coverage: coverage.get(r.id) ?? null })), total, page: q.page, pageSize: q.pageSize }
}

/** The list's rows with the raw inputs the export recomputes each exercise from. */
export async function exportFitTests(organizationId: string, q: ListFitTestsQuery) {
  const rows = await useDb().select({ ...listColumns, protocol: t.protocol, entry: t.entry, seriesText: t.seriesText, sampleFlowCm3PerMin: t.sampleFlowCm3PerMin })
    .from(t)
    .innerJoin(p, eq(p.id, t.personId))
    .innerJoin(schema.sites, eq(schema.sites.id, t.siteId))
    .innerJoin(schema.users, eq(schema.users.id, t.testerUserId))
    .leftJoin(schema.counters, eq(schema.counters.id, t.counterId))
    .where(listConditions(organizationId, q)).orderBy(desc(t.performedAt)).limit(50_000)
  const coverage = await findCoverageMany(organizationId, rows)
  return rows.map(r => ({ ...r, coverage: coverage.get(r.id) ?? null }))
}

/** The last passing finished test of each person: their current respirator and next due date. */
export async function latestPassByPerson(organizationId: string) {
  const rows = await useDb().selectDistinctOn([t.personId], {
    personId: t.personId,
    siteId: t.siteId,
    counterId: t.counterId, dueOn: t.dueOn, performedAt: t.performedAt,
    respiratorMake: t.respiratorMake, respiratorModel: t.respiratorModel, respiratorSize: t.respiratorSize
  }).from(t)
    .where(and(eq(t.organizationId, organizationId), eq(t.status, 'finished'), eq(t.passed, true), isNotNull(t.dueOn)))
    .orderBy(t.personId, desc(t.performedAt))
  return new Map(rows.map(r => [r.personId, r]))
}
