import { createPracticeSetSchema } from '#shared/utils/practice-schemas'

export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'use-lab')
  const input = await parseBody(event, createPracticeSetSchema)
  const row = await useDb().transaction(async (tx) => {
    const [set] = await tx.insert(schema.practiceSets).values({ organizationId: caller.organizationId, name: input.name, createdByUserId: caller.id }).returning()
    await writeAudit(tx, caller, { entityType: 'practice-set', entityId: set!.id, action: 'created', after: { name: set!.name } })
    return set!
  })
  setResponseStatus(event, 201)
  return practiceSetView(row)
})
