import { and, asc, count, desc, eq, gte, ilike, isNotNull, lt, ne, or, sql } from 'drizzle-orm'
import type { Placeholder, SQL } from 'drizzle-orm'
import type { ListFitTestsQuery } from '#shared/utils/fit-test-schemas'

const t = schema.fitTests
const p = schema.people

/**
 * How a filter's value enters the statement: as itself (a statement built for this request), or
 * as a named placeholder (a statement prepared once for every request of the same shape).
 */
type Bind = <T>(name: string, value: T) => T | Placeholder
const asValue: Bind = (_name, value) => value
export const asPlaceholder: Bind = name => sql.placeholder(name)

/** What a person typed, matched anywhere in the text, their % and _ taken as themselves. */
const likePattern = (text: string) => `%${text.replace(/[%_\\]/g, m => `\\${m}`)}%`

export function listConditions(organizationId: string, q: Omit<ListFitTestsQuery, 'page' | 'pageSize' | 'sort' | 'dir'>, onlyPersonUserId?: string, bind: Bind = asValue) {
  const where: (SQL | undefined)[] = [
    eq(t.organizationId, bind('organizationId', organizationId)),
    // One line per record: superseded revisions and open corrections stay on the record's own page.
    ne(t.status, 'superseded'),
    ne(t.status, 'discarded'),
    or(ne(t.status, 'draft'), eq(t.revision, 1))
  ]
  if (onlyPersonUserId) where.push(eq(p.userId, bind('onlyPersonUserId', onlyPersonUserId)))
  if (q.personId) where.push(eq(t.personId, bind('personId', q.personId)))
  if (q.siteId) where.push(eq(t.siteId, bind('siteId', q.siteId)))
  if (q.kind) where.push(eq(t.kind, bind('kind', q.kind)))
  if (q.result === 'pass') where.push(eq(t.status, 'finished'), eq(t.passed, true))
  if (q.result === 'fail') where.push(eq(t.status, 'finished'), eq(t.passed, false))
  if (q.result === 'draft') where.push(eq(t.status, 'draft'))
  if (q.result === 'withdrawn') where.push(eq(t.status, 'withdrawn'))
  if (q.from) where.push(gte(t.performedAt, bind('from', new Date(`${q.from}T00:00:00Z`))))
  if (q.to) where.push(lt(t.performedAt, sql`(${bind('to', q.to)}::date + 1)::timestamptz`))
  if (q.q) {
    const like = bind('like', likePattern(q.q))
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
  // The page and its total in one round trip, as a statement prepared once per shape of filter.
  const found = await listStatement(q, onlyPersonUserId).execute({
    organizationId, onlyPersonUserId, personId: q.personId, siteId: q.siteId, kind: q.kind,
    from: q.from ? new Date(`${q.from}T00:00:00Z`) : undefined, to: q.to,
    like: q.q ? likePattern(q.q) : undefined,
    limit: q.pageSize, offset: (q.page - 1) * q.pageSize
  })
  const rows = found.map(({ total: _total, ...row }) => row)
  // A page past the end has no row to carry the total.
  const total = found[0]?.total ?? (q.page > 1 ? (await countListed(organizationId, q, onlyPersonUserId))[0]?.n ?? 0 : 0)
  const coverage = await findCoverageMany(organizationId, rows)
  return { rows: rows.map(r => ({ ...r, coverage: coverage.get(r.id) ?? null })), total, page: q.page, pageSize: q.pageSize }
}

/** The records the list would show, counted. The count joins people only when a filter reads them (every record has its person). */
function countListed(organizationId: string, q: ListFitTestsQuery, onlyPersonUserId: string | undefined, bind: Bind = asValue) {
  const from = useDb().select({ n: count() }).from(t)
  return (q.q || onlyPersonUserId ? from.innerJoin(p, eq(p.id, t.personId)) : from).where(listConditions(organizationId, q, onlyPersonUserId, bind))
}

type ListStatement = ReturnType<typeof buildListStatement>
const listStatements = new Map<string, ListStatement>()
/** Shapes kept at most: each is a named statement on every pooled connection. */
const LIST_SHAPES = 64

/** The prepared list statement for this request's shape: which filters are set, the sort and its direction. */
function listStatement(q: ListFitTestsQuery, onlyPersonUserId: string | undefined): ListStatement {
  const shape = [q.personId, q.siteId, q.kind, q.from, q.to, q.q, onlyPersonUserId].map(v => (v ? '1' : '0')).join('') + `-${q.result ?? 'any'}-${q.sort}-${q.dir}`
  let statement = listStatements.get(shape)
  if (!statement) {
    if (listStatements.size >= LIST_SHAPES) listStatements.clear()
    statement = buildListStatement(q, onlyPersonUserId, `fit_test_list_${shape.replaceAll('-', '_')}`)
    listStatements.set(shape, statement)
  }
  return statement
}

function buildListStatement(q: ListFitTestsQuery, onlyPersonUserId: string | undefined, name: string) {
  const where = listConditions('', q, onlyPersonUserId, asPlaceholder)
  const order = q.dir === 'asc' ? asc : desc
  const sortColumn = q.sort === 'person' ? p.fullName : q.sort === 'overallFitFactor' ? t.overallFitFactor : t.performedAt
  // The total is an uncorrelated subquery, run once.
  const totalOf = sql<number>`(${countListed('', q, onlyPersonUserId, asPlaceholder)})`.mapWith(Number)
  return useDb().select({ ...listColumns, total: totalOf }).from(t)
    .innerJoin(p, eq(p.id, t.personId))
    .innerJoin(schema.sites, eq(schema.sites.id, t.siteId))
    .innerJoin(schema.users, eq(schema.users.id, t.testerUserId))
    .leftJoin(schema.counters, eq(schema.counters.id, t.counterId))
    .where(where).orderBy(order(sortColumn), desc(t.performedAt))
    .limit(sql.placeholder('limit')).offset(sql.placeholder('offset'))
    .prepare(name)
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
