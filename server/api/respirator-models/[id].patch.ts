import { and, eq } from 'drizzle-orm'
import { updateRespiratorModelSchema } from '#shared/utils/respirator-schemas'
import { idParamSchema } from '#shared/utils/user-schemas'

export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'administer')
  const { id } = parseParams(event, idParamSchema)
  const changes = await parseBody(event, updateRespiratorModelSchema)
  const before = await findRespiratorModel(caller.organizationId, id)
  const r = schema.respiratorModels
  return useDb().transaction(async (tx) => {
    const [row] = await tx.update(r).set(changes).where(and(eq(r.organizationId, caller.organizationId), eq(r.id, id))).returning()
    await writeAudit(tx, caller, { entityType: 'respirator-model', entityId: id, action: 'updated', before, after: changes })
    return respiratorModelView(row!)
  })
})
