import { changeMaskStateSchema } from '#shared/utils/mask-schemas'
import { idParamSchema } from '#shared/utils/user-schemas'

/** Puts a unit in service, holds it or retires it, with the reason kept in its history. */
export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'record')
  const { id } = parseParams(event, idParamSchema)
  const { state, reason, override } = await parseBody(event, changeMaskStateSchema)
  await moveUnitState(caller, id, state, reason, { override })
  return findMaskUnit(caller.organizationId, id)
})
