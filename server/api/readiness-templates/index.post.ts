import { readinessTemplateSchema } from '#shared/utils/readiness-schemas'

export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'administer')
  const input = await parseBody(event, readinessTemplateSchema)
  const created = await useDb().transaction(async (tx) => {
    const [row] = await tx.insert(schema.readinessTemplates).values({ ...input, organizationId: caller.organizationId }).returning()
    await writeAudit(tx, caller, { entityType: 'readiness-template', entityId: row!.id, action: 'created', after: input })
    return row!
  })
  setResponseStatus(event, 201)
  return readinessTemplateView(created)
})
