import { listFitTestsQuerySchema } from '#shared/utils/fit-test-schemas'

export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'read-fit-tests')
  const query = parseQuery(event, listFitTestsQuerySchema)
  // A wearer's list holds only their own records, whatever the filters say.
  return listFitTests(caller.organizationId, query, caller.role === 'wearer' ? caller.id : undefined)
})
