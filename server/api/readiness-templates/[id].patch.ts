import { and, eq } from 'drizzle-orm'
import { readinessTemplateSchema, updateReadinessTemplateSchema } from '#shared/utils/readiness-schemas'
import { idParamSchema } from '#shared/utils/user-schemas'

export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'administer')
  const { id } = parseParams(event, idParamSchema)
  const changes = await parseBody(event, updateReadinessTemplateSchema)
  const before = await findTemplate(caller.organizationId, id)
  // The whole template is checked again, so a partial edit cannot leave duplicate steps behind.
  const merged = readinessTemplateSchema.safeParse({ name: changes.name ?? before.name, scope: before.scope, steps: changes.steps ?? before.steps })
  if (!merged.success) {
    const fieldErrors = fieldErrorsOf(merged.error)
    throw httpError(400, `Check the form: ${Object.values(fieldErrors)[0]}`, { fieldErrors })
  }
  return useDb().transaction(async (tx) => {
    const [row] = await tx.update(schema.readinessTemplates).set({ ...changes, isDefault: changes.steps ? false : before.isDefault })
      .where(and(eq(schema.readinessTemplates.organizationId, caller.organizationId), eq(schema.readinessTemplates.id, id)))
      .returning()
    await writeAudit(tx, caller, { entityType: 'readiness-template', entityId: id, action: changes.active === false ? 'retired' : 'updated', before, after: changes })
    return readinessTemplateView(row!)
  })
})
