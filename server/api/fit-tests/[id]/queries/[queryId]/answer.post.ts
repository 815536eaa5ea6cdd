import { and, eq } from 'drizzle-orm'
import { answerQuerySchema, queryParamsSchema } from '#shared/utils/insight-schemas'

/** The tester answers a reviewer's query; the answer stays on the record. */
export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'record')
  const { id, queryId } = parseParams(event, queryParamsSchema)
  const { answer } = await parseBody(event, answerQuerySchema)
  const row = await findFitTest(caller.organizationId, id)
  const q = schema.reviewQueries
  await useDb().transaction(async (tx) => {
    const [answered] = await tx.update(q).set({ status: 'answered', answer, answeredByUserId: caller.id, answeredAt: new Date() })
      .where(and(eq(q.id, queryId), eq(q.organizationId, caller.organizationId), eq(q.recordId, row.recordId), eq(q.status, 'open'))).returning()
    if (!answered) {
      const [exists] = await tx.select({ id: q.id }).from(q).where(and(eq(q.id, queryId), eq(q.organizationId, caller.organizationId), eq(q.recordId, row.recordId)))
      throw exists
        ? httpError(409, 'This query has already been answered.')
        : httpError(404, 'No such query on this record.')
    }
    await writeAudit(tx, caller, { entityType: 'fit-test', entityId: answered.fitTestId, action: 'query-answered', after: { queryId, answer } })
  })
  return await reviewOfRecord(caller.organizationId, id)
})
