import { respiratorModelSchema } from '#shared/utils/respirator-schemas'

export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'administer')
  const input = await parseBody(event, respiratorModelSchema)
  const created = await useDb().transaction(async (tx) => {
    // A make and model already listed is refused by its unique index (server/utils/database-refusals.ts).
    const [row] = await tx.insert(schema.respiratorModels).values({ ...input, organizationId: caller.organizationId }).returning()
    await writeAudit(tx, caller, { entityType: 'respirator-model', entityId: row!.id, action: 'created', after: input })
    return row!
  })
  setResponseStatus(event, 201)
  return respiratorModelView(created)
})
