import { respiratorModelSchema } from '#shared/utils/respirator-schemas'

export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'administer')
  const input = await parseBody(event, respiratorModelSchema)
  const created = await useDb().transaction(async (tx) => {
    const [row] = await tx.insert(schema.respiratorModels).values({ ...input, organizationId: caller.organizationId }).onConflictDoNothing().returning()
    if (!row) throw httpError(409, `${input.make} ${input.model} is already in the catalogue.`, { fieldErrors: { model: 'Already in the catalogue.' } })
    await writeAudit(tx, caller, { entityType: 'respirator-model', entityId: row.id, action: 'created', after: input })
    return row
  })
  setResponseStatus(event, 201)
  return created
})
