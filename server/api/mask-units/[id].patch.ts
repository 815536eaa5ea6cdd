import { and, eq } from 'drizzle-orm'
import { updateMaskUnitSchema } from '#shared/utils/mask-schemas'
import { idParamSchema } from '#shared/utils/user-schemas'

export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'record')
  const { id } = parseParams(event, idParamSchema)
  const changes = await parseBody(event, updateMaskUnitSchema)
  const before = await findMaskUnit(caller.organizationId, id)
  await assertUnitRefs(caller.organizationId, changes)
  await useDb().transaction(async (tx) => {
    await tx.update(schema.maskUnits).set(changes)
      .where(and(eq(schema.maskUnits.organizationId, caller.organizationId), eq(schema.maskUnits.id, id)))
    await writeAudit(tx, caller, { entityType: 'mask-unit', entityId: id, action: 'updated', before, after: changes })
  })
  return findMaskUnit(caller.organizationId, id)
})
