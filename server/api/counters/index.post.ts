import { counterSchema } from '#shared/utils/equipment-schemas'

export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'record')
  const input = await parseBody(event, counterSchema)
  await assertSite(caller.organizationId, input.siteId)
  const created = await useDb().transaction(async (tx) => {
    const [row] = await tx.insert(schema.counters).values({ ...input, organizationId: caller.organizationId }).returning()
    await writeAudit(tx, caller, { entityType: 'counter', entityId: row!.id, action: 'created', after: input })
    return row!
  })
  setResponseStatus(event, 201)
  return counterView(created)
})
