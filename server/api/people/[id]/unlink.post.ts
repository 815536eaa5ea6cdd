import { and, eq } from 'drizzle-orm'
import { idParamSchema } from '#shared/utils/user-schemas'

/** Unlinks a roster entry from its wearer account; the account stays and the change is audited. */
export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'administer')
  const { id } = parseParams(event, idParamSchema)
  const person = await findPerson(caller.organizationId, id)
  if (!person.userId) throw httpError(409, 'This person is not linked to an account.')
  await useDb().transaction(async (tx) => {
    await tx.update(schema.people).set({ userId: null }).where(and(eq(schema.people.organizationId, caller.organizationId), eq(schema.people.id, id)))
    await writeAudit(tx, caller, { entityType: 'person', entityId: id, action: 'account-unlinked', before: { userId: person.userId } })
  })
  return { personId: id, userId: null }
})
