import { idParamSchema } from '#shared/utils/user-schemas'

export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'read-fit-tests')
  const { id } = parseParams(event, idParamSchema)
  const row = await findFitTest(caller.organizationId, id)
  await assertMayRead(caller, row)
  return fitTestView(caller, row)
})
