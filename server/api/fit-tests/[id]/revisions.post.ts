import { reasonSchema } from '#shared/utils/fit-test-schemas'
import { idParamSchema } from '#shared/utils/user-schemas'

/**
 * Starts a correction: a new draft revision copied from the finished one, with the reason. Under
 * the record lock, so two corrections at once give one draft and one 409.
 */
export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'record')
  const { id } = parseParams(event, idParamSchema)
  const { reason } = await parseBody(event, reasonSchema)
  const { recordId } = await findFitTest(caller.organizationId, id)
  const t = schema.fitTests
  const created = await useDb().transaction(async (tx) => {
    const revisions = await lockRecord(tx, caller.organizationId, recordId)
    const row = revisions.find(r => r.id === id)!
    if (row.status !== 'finished') {
      throw httpError(409, row.status === 'draft'
        ? 'This is still a draft: edit it directly.'
        : row.status === 'withdrawn' ? 'This record has been withdrawn and cannot be corrected.' : 'Only the current finished revision can be corrected.')
    }
    const openDraft = revisions.find(r => r.status === 'draft')
    if (openDraft) {
      throw httpError(409, 'A correction of this record is already in progress.', { draftId: openDraft.id })
    }
    const { id: _id, createdAt: _c, updatedAt: _u, finishedAt: _f, finishedByUserId: _fb, idempotencyKey: _k, ...copy } = row
    const [draft] = await tx.insert(t).values({ ...copy, revision: Math.max(...revisions.map(r => r.revision)) + 1, revisionReason: reason, status: 'draft', version: 1, testerUserId: caller.id }).returning()
    await writeAudit(tx, caller, { entityType: 'fit-test', entityId: draft!.id, action: 'revision-started', before: { revisionOf: row.id, revision: row.revision }, after: { revision: draft!.revision, reason } })
    return draft!
  })
  setResponseStatus(event, 201)
  return fitTestView(caller, created)
})
