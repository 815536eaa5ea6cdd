import { idParamSchema } from '#shared/utils/user-schemas'

/** The count series exactly as it was pasted or uploaded: the raw readings behind the result. */
export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'read-fit-tests')
  const { id } = parseParams(event, idParamSchema)
  const row = await findFitTest(caller.organizationId, id)
  await assertMayRead(caller, row)
  if (!row.seriesText) throw httpError(404, 'This record has no count series: its results were typed per exercise.')
  setResponseHeader(event, 'Content-Type', 'text/plain; charset=utf-8')
  setResponseHeader(event, 'Content-Disposition', `${getQuery(event).download === '1' ? 'attachment' : 'inline'}; filename="count-series-revision-${row.revision}.txt"`)
  return row.seriesText
})
