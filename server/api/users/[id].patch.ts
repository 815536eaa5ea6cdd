import { and, eq } from 'drizzle-orm'
import { idParamSchema, updateUserSchema } from '#shared/utils/user-schemas'

export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'administer')
  const { id } = parseParams(event, idParamSchema)
  const changes = await parseBody(event, updateUserSchema)
  const before = await findUser(caller.organizationId, id)

  const losesAdmin = before.role === 'admin' && before.active && ((changes.role && changes.role !== 'admin') || changes.active === false)
  if (losesAdmin && id === caller.id) {
    throw httpError(409, 'You cannot remove your own administrator access. Ask another administrator.')
  }
  if (losesAdmin && await countOtherActiveAdmins(caller.organizationId, id) === 0) {
    throw httpError(409, 'This is the last active administrator. Make someone else an administrator first.')
  }

  await useDb().transaction(async (tx) => {
    await tx.update(schema.users).set(changes)
      .where(and(eq(schema.users.organizationId, caller.organizationId), eq(schema.users.id, id)))
    // Deactivation ends every session for good: reactivating later does not revive old cookies.
    if (changes.active === false && before.active) await endAllSessions(tx, id)
    await writeAudit(tx, caller, {
      entityType: 'user', entityId: id, action: 'updated',
      before: { displayName: before.displayName, role: before.role, active: before.active },
      after: changes
    })
  })
  return findUser(caller.organizationId, id)
})
