import { idParamSchema } from '#shared/utils/user-schemas'

export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'read-program')
  const { id } = parseParams(event, idParamSchema)
  return benchRigView(await findBenchRig(caller.organizationId, id))
})
