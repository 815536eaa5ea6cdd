import { idParamSchema } from '#shared/utils/user-schemas'

export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'admin')
  const { id } = parseParams(event, idParamSchema)
  return findUser(caller.organizationId, id)
})
