import { personSchema } from '#shared/utils/person-schemas'

export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'record')
  const input = await parseBody(event, personSchema)
  await assertSiteOf(caller.organizationId, input.siteId)
  const person = await useDb().transaction(async (tx) => {
    // A taken employee number is refused by its unique index (server/utils/database-refusals.ts).
    const [row] = await tx.insert(schema.people).values({ ...input, organizationId: caller.organizationId }).returning()
    await writeAudit(tx, caller, { entityType: 'person', entityId: row!.id, action: 'created', after: input })
    return row!
  })
  setResponseStatus(event, 201)
  return personView(person)
})
