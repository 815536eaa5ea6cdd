import { changeMaskStateSchema, MASK_UNIT_STATE_LABELS } from '#shared/utils/mask-schemas'
import { idParamSchema } from '#shared/utils/user-schemas'

/** Puts a unit in service, holds it or retires it, with the reason kept in its history. */
export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'tester')
  const { id } = parseParams(event, idParamSchema)
  const { state, reason } = await parseBody(event, changeMaskStateSchema)
  const unit = await findMaskUnit(caller.organizationId, id)
  if (unit.state === 'retired') {
    throw httpError(409, 'This unit is retired; a retired unit does not come back into use.')
  }
  if (unit.state === state) {
    throw httpError(409, `This unit is already ${MASK_UNIT_STATE_LABELS[state].toLowerCase()}.`)
  }
  await useDb().transaction(tx => changeUnitState(tx, caller, unit, state, reason))
  return findMaskUnit(caller.organizationId, id)
})
