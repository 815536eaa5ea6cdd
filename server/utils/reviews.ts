import { and, desc, eq, inArray, sql } from 'drizzle-orm'
import type { InsightFilters } from '#shared/utils/insight-schemas'

/** Countersign and queries of revisions, newest query first. */
export async function reviewsOf(organizationId: string, fitTestIds: string[]) {
  if (fitTestIds.length === 0) return { countersigns: [], queries: [] }
  const c = schema.countersigns
  const q = schema.reviewQueries
  const signer = schema.users
  const [countersigns, queries] = await Promise.all([
    useDb().select({ id: c.id, fitTestId: c.fitTestId, comment: c.comment, signedAt: c.signedAt, signedBy: signer.displayName })
      .from(c).innerJoin(signer, eq(signer.id, c.signedByUserId))
      .where(and(eq(c.organizationId, organizationId), inArray(c.fitTestId, fitTestIds))),
    useDb().select({
      id: q.id, fitTestId: q.fitTestId, question: q.question, status: q.status, answer: q.answer, createdAt: q.createdAt, answeredAt: q.answeredAt,
      raisedBy: sql<string>`(select display_name from users where id = ${q.raisedByUserId})`,
      answeredBy: sql<string | null>`(select display_name from users where id = ${q.answeredByUserId})`
    }).from(q).where(and(eq(q.organizationId, organizationId), inArray(q.fitTestId, fitTestIds))).orderBy(desc(q.createdAt))
  ])
  return { countersigns, queries }
}

/** The review state of one record: its current revision's countersign and every query on the record. */
export async function reviewOfRecord(organizationId: string, fitTestId: string) {
  const row = await findFitTest(organizationId, fitTestId)
  const revisions = await listRevisions(organizationId, row.recordId)
  const ids = revisions.map(r => r.id)
  const { countersigns, queries } = await reviewsOf(organizationId, ids)
  const revisionOf = new Map(revisions.map(r => [r.id, r.revision]))
  return {
    fitTestId: row.id,
    revision: row.revision,
    status: row.status,
    countersign: countersigns.find(c => c.fitTestId === row.id) ?? null,
    /** Countersigns of earlier revisions: they do not carry over to a correction. */
    earlierCountersigns: countersigns.filter(c => c.fitTestId !== row.id).map(c => ({ ...c, revision: revisionOf.get(c.fitTestId) ?? null })),
    queries: queries.map(q => ({ ...q, revision: revisionOf.get(q.fitTestId) ?? null }))
  }
}

/** Finished current revisions with no countersign, oldest first, with the insights filters. */
export async function reviewQueue(organizationId: string, f: InsightFilters, limit = 200) {
  const result = await useDb().execute(sql`
    select ft.id, ft.record_id, ft.revision, ft.performed_at, p.full_name as person_name, ft.respirator_make, ft.respirator_model,
      ft.respirator_size, ft.kind, ft.overall_fit_factor, ft.overall_is_lower_bound, ft.passed, ft.pass_level, ft.counter_id, ft.site_id,
      u.display_name as tester_name, st.name as site_name,
      (select count(*) from review_queries q where q.fit_test_id = ft.id and q.status = 'open') as open_queries,
      (select count(*) from review_queries q where q.fit_test_id = ft.id and q.status = 'answered') as answered_queries,
      count(*) over () as total
    from fit_tests ft
    join people p on p.id = ft.person_id
    join users u on u.id = ft.tester_user_id
    join sites st on st.id = ft.site_id
    where ${insightScope(organizationId, f)}
      and not exists (select 1 from countersigns c where c.fit_test_id = ft.id)
    order by ft.performed_at asc, ft.id
    limit ${limit}`)
  const rows = result.rows as Record<string, unknown>[]
  return {
    total: rows.length > 0 ? Number(rows[0]!.total) : 0,
    rows: rows.map(r => ({
      id: String(r.id),
      recordId: String(r.record_id),
      revision: Number(r.revision),
      performedAt: new Date(r.performed_at as string).toISOString(),
      personName: String(r.person_name),
      respiratorMake: String(r.respirator_make),
      respiratorModel: String(r.respirator_model),
      respiratorSize: String(r.respirator_size),
      kind: String(r.kind),
      overallFitFactor: r.overall_fit_factor === null ? null : Number(r.overall_fit_factor),
      overallIsLowerBound: r.overall_is_lower_bound === true,
      passed: r.passed === null ? null : Boolean(r.passed),
      passLevel: r.pass_level === null ? null : Number(r.pass_level),
      counterId: r.counter_id === null ? null : String(r.counter_id),
      siteId: String(r.site_id),
      testerName: String(r.tester_name),
      siteName: String(r.site_name),
      openQueries: Number(r.open_queries),
      answeredQueries: Number(r.answered_queries)
    }))
  }
}

/** Only the current finished revision can be countersigned or queried. */
export function assertReviewable(row: FitTestRow) {
  if (row.status !== 'finished') {
    const why = row.status === 'draft' ? 'it is still a draft' : row.status === 'superseded' ? 'a correction replaced it: review the current revision' : 'it was withdrawn'
    throw httpError(409, `This result cannot be reviewed: ${why}.`)
  }
}
