import { idParamSchema } from '#shared/utils/user-schemas'

export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'administer')
  const { id } = parseParams(event, idParamSchema)
  return findUser(caller.organizationId, id)
})
