import { listPeopleQuerySchema } from '#shared/utils/person-schemas'

export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'read-program')
  return listPeople(caller.organizationId, parseQuery(event, listPeopleQuerySchema))
})
