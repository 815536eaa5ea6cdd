import { createPracticePersonSchema } from '#shared/utils/practice-schemas'

export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'use-lab')
  const input = await parseBody(event, createPracticePersonSchema)
  const set = await findPracticeSet(caller.organizationId, input.practiceSetId)
  const row = await useDb().transaction(async (tx) => {
    const [person] = await tx.insert(schema.practicePeople).values({ organizationId: caller.organizationId, practiceSetId: set.id, fullName: input.fullName }).returning()
    await writeAudit(tx, caller, { entityType: 'practice-person', entityId: person!.id, action: 'created', after: { practiceSetId: set.id, fullName: person!.fullName } })
    return person!
  })
  setResponseStatus(event, 201)
  return practicePersonView(row)
})
