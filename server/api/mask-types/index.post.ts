import { maskTypeSchema } from '#shared/utils/mask-schemas'

export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'record')
  const input = await parseBody(event, maskTypeSchema)
  const created = await useDb().transaction(async (tx) => {
    const [row] = await tx.insert(schema.maskTypes).values({ ...input, organizationId: caller.organizationId }).returning()
    await writeAudit(tx, caller, { entityType: 'mask-type', entityId: row!.id, action: 'created', after: input })
    return row!
  })
  setResponseStatus(event, 201)
  return maskTypeView(created)
})
