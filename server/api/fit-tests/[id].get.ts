import { idParamSchema } from '#shared/utils/user-schemas'

export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'read-fit-tests')
  const { id } = parseParams(event, idParamSchema)
  // One query; a wearer's check (their own records only) is made on what it read.
  return fitTestView(caller, id)
})
