import { listUsersQuerySchema } from '#shared/utils/user-schemas'

export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'administer')
  const query = parseQuery(event, listUsersQuerySchema)
  return listUsers(caller.organizationId, query)
})
