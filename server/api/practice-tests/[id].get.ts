import { idParamSchema } from '#shared/utils/user-schemas'

export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'read-practice')
  const { id } = parseParams(event, idParamSchema)
  return practiceTestView(caller.organizationId, await findPracticeTest(caller.organizationId, id))
})
