import { benchRigSchema } from '#shared/utils/equipment-schemas'

export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'record')
  const input = await parseBody(event, benchRigSchema)
  await assertSite(caller.organizationId, input.siteId)
  await assertPairableCounter(caller.organizationId, input.counterId)
  const created = await useDb().transaction(async (tx) => {
    const [row] = await tx.insert(schema.benchRigs).values({ ...input, organizationId: caller.organizationId }).returning()
    await writeAudit(tx, caller, { entityType: 'bench-rig', entityId: row!.id, action: 'created', after: input })
    return row!
  })
  setResponseStatus(event, 201)
  return benchRigView(created)
})
