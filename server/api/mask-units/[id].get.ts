import { idParamSchema } from '#shared/utils/user-schemas'

/** The unit with its state history and every headform test, recomputed, with its coverage. */
export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'read-program')
  const { id } = parseParams(event, idParamSchema)
  const unit = await findMaskUnit(caller.organizationId, id)
  const [events, headformTests] = await Promise.all([
    listUnitEvents(caller.organizationId, id),
    listHeadformTests(caller.organizationId, { maskUnitId: id })
  ])
  return { ...unit, events, headformTests }
})
