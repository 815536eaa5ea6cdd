import { and, eq } from 'drizzle-orm'
import { updateCounterSchema } from '#shared/utils/equipment-schemas'
import { idParamSchema } from '#shared/utils/user-schemas'

export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'record')
  const { id } = parseParams(event, idParamSchema)
  const changes = await parseBody(event, updateCounterSchema)
  const before = await findCounter(caller.organizationId, id)
  await assertSite(caller.organizationId, changes.siteId)
  return useDb().transaction(async (tx) => {
    const [row] = await tx.update(schema.counters).set(changes)
      .where(and(eq(schema.counters.organizationId, caller.organizationId), eq(schema.counters.id, id)))
      .returning()
    const action = changes.active === false ? 'retired' : changes.active === true && !before.active ? 'reinstated' : 'updated'
    await writeAudit(tx, caller, { entityType: 'counter', entityId: id, action, before, after: changes })
    return counterView(row!)
  })
})
