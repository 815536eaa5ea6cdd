import { assessmentListQuerySchema } from '#shared/utils/exposure-schemas'

/** Assigned people who are not protected for their job, optionally for one person. */
export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'read-program')
  const { personId } = parseQuery(event, assessmentListQuerySchema)
  return protectionGaps(caller.organizationId, await programToday(caller.organizationId), personId)
})
