import { listUsersQuerySchema } from '#shared/utils/user-schemas'

export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'admin')
  const query = parseQuery(event, listUsersQuerySchema)
  return listUsers(caller.organizationId, query)
})
