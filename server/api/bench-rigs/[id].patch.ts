import { and, eq } from 'drizzle-orm'
import { updateBenchRigSchema } from '#shared/utils/equipment-schemas'
import { idParamSchema } from '#shared/utils/user-schemas'

export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'record')
  const { id } = parseParams(event, idParamSchema)
  const changes = await parseBody(event, updateBenchRigSchema)
  const before = await findBenchRig(caller.organizationId, id)
  await assertSite(caller.organizationId, changes.siteId)
  if (changes.counterId) await assertPairableCounter(caller.organizationId, changes.counterId)
  return useDb().transaction(async (tx) => {
    const [row] = await tx.update(schema.benchRigs).set(changes)
      .where(and(eq(schema.benchRigs.organizationId, caller.organizationId), eq(schema.benchRigs.id, id)))
      .returning()
    const action = changes.active === false ? 'retired' : changes.active === true && !before.active ? 'reinstated' : 'updated'
    await writeAudit(tx, caller, { entityType: 'bench-rig', entityId: id, action, before, after: changes })
    return benchRigView(row!)
  })
})
