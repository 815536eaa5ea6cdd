import { raiseQuerySchema } from '#shared/utils/insight-schemas'
import { idParamSchema } from '#shared/utils/user-schemas'

/** A reviewer sends a question about the current revision back to the tester. */
export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'review')
  const { id } = parseParams(event, idParamSchema)
  const { question } = await parseBody(event, raiseQuerySchema)
  const row = await findFitTest(caller.organizationId, id)
  assertReviewable(row)
  await useDb().transaction(async (tx) => {
    const [raised] = await tx.insert(schema.reviewQueries)
      .values({ organizationId: caller.organizationId, fitTestId: row.id, recordId: row.recordId, raisedByUserId: caller.id, question }).returning()
    await writeAudit(tx, caller, { entityType: 'fit-test', entityId: row.id, action: 'query-raised', after: { queryId: raised!.id, revision: row.revision, question } })
  })
  setResponseStatus(event, 201)
  return await reviewOfRecord(caller.organizationId, id)
})
