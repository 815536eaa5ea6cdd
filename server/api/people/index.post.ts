import { personSchema } from '#shared/utils/person-schemas'

export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'record')
  const input = await parseBody(event, personSchema)
  await assertSiteOf(caller.organizationId, input.siteId)
  const person = await useDb().transaction(async (tx) => {
    const [row] = await tx.insert(schema.people).values({ ...input, organizationId: caller.organizationId })
      .onConflictDoNothing().returning()
    if (!row) throw duplicateEmployeeNumber(input.employeeNumber ?? '')
    await writeAudit(tx, caller, { entityType: 'person', entityId: row.id, action: 'created', after: input })
    return row
  })
  setResponseStatus(event, 201)
  return person
})
