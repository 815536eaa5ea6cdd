import { idParamSchema } from '#shared/utils/user-schemas'

/** Countersign and queries of a record, for its result page and printable record. */
export default defineEventHandler(async (event) => {
  const caller = await requireRole(event)
  const { id } = parseParams(event, idParamSchema)
  const row = await findFitTest(caller.organizationId, id)
  await assertMayRead(caller, row)
  return await reviewOfRecord(caller.organizationId, id)
})
