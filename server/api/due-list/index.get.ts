import { dueListQuerySchema } from '#shared/utils/oversight-schemas'

export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'read-program')
  const q = parseQuery(event, dueListQuerySchema)
  const today = await programToday(caller.organizationId)
  return { today, rows: await dueList(caller.organizationId, today, q) }
})
