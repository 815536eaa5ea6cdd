import { and, eq } from 'drizzle-orm'
import { updateMaskTypeSchema } from '#shared/utils/mask-schemas'
import { idParamSchema } from '#shared/utils/user-schemas'

export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'record')
  const { id } = parseParams(event, idParamSchema)
  const changes = await parseBody(event, updateMaskTypeSchema)
  const before = await findMaskType(caller.organizationId, id)
  return useDb().transaction(async (tx) => {
    const [row] = await tx.update(schema.maskTypes).set(changes)
      .where(and(eq(schema.maskTypes.organizationId, caller.organizationId), eq(schema.maskTypes.id, id)))
      .returning()
    await writeAudit(tx, caller, { entityType: 'mask-type', entityId: id, action: 'updated', before, after: changes })
    return maskTypeView(row!)
  })
})
