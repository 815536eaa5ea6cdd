import { maskUnitSchema } from '#shared/utils/mask-schemas'

export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'record')
  const input = await parseBody(event, maskUnitSchema)
  await assertUnitRefs(caller.organizationId, input)
  const id = await useDb().transaction(async (tx) => {
    const [row] = await tx.insert(schema.maskUnits).values({ ...input, organizationId: caller.organizationId }).returning()
    await tx.insert(schema.maskUnitEvents).values({ organizationId: caller.organizationId, maskUnitId: row!.id, fromState: null, toState: 'in-service', reason: 'Added to the register', actorUserId: caller.id })
    await writeAudit(tx, caller, { entityType: 'mask-unit', entityId: row!.id, action: 'created', after: input })
    return row!.id
  })
  setResponseStatus(event, 201)
  return findMaskUnit(caller.organizationId, id)
})
