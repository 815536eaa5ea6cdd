import { countersignSchema } from '#shared/utils/insight-schemas'
import { idParamSchema } from '#shared/utils/user-schemas'

/** A reviewer countersigns the current finished revision, with an optional comment. */
export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'review')
  const { id } = parseParams(event, idParamSchema)
  const { comment } = await parseBody(event, countersignSchema)
  const row = await findFitTest(caller.organizationId, id)
  assertReviewable(row)
  const created = await useDb().transaction(async (tx) => {
    const [signed] = await tx.insert(schema.countersigns)
      .values({ organizationId: caller.organizationId, fitTestId: row.id, recordId: row.recordId, signedByUserId: caller.id, comment: comment || null })
      .onConflictDoNothing().returning()
    if (!signed) throw httpError(409, 'This revision is already countersigned.')
    await writeAudit(tx, caller, { entityType: 'fit-test', entityId: row.id, action: 'countersigned', after: { revision: row.revision, comment: signed.comment } })
    return signed
  })
  setResponseStatus(event, 201)
  return { countersign: { id: created.id, comment: created.comment, signedAt: created.signedAt }, review: await reviewOfRecord(caller.organizationId, id) }
})
