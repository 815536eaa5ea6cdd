import { assignRespiratorSchema } from '#shared/utils/oversight-schemas'
import { idParamSchema } from '#shared/utils/user-schemas'

/** Assigns a catalogue respirator to a person: it then needs its own passing fit test — (f)(2). */
export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'record')
  const { id } = parseParams(event, idParamSchema)
  const { respiratorModelId } = await parseBody(event, assignRespiratorSchema)
  await findPerson(caller.organizationId, id)
  const model = await findRespiratorModel(caller.organizationId, respiratorModelId)
    .catch(() => { throw httpError(400, 'Choose a respirator from your catalogue.', { fieldErrors: { respiratorModelId: 'Choose a respirator from your catalogue.' } }) })
  await useDb().transaction(async (tx) => {
    const [row] = await tx.insert(schema.respiratorAssignments).values({ organizationId: caller.organizationId, personId: id, respiratorModelId: model.id }).onConflictDoNothing().returning()
    if (row) await writeAudit(tx, caller, { entityType: 'person', entityId: id, action: 'respirator-assigned', after: { respiratorModelId: model.id, respirator: `${model.make} ${model.model}` } })
  })
  setResponseStatus(event, 201)
  return { personId: id, respiratorModelId: model.id }
})
