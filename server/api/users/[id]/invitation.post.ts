import { idParamSchema } from '#shared/utils/user-schemas'

export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'administer')
  const { id } = parseParams(event, idParamSchema)
  const user = await findUser(caller.organizationId, id)
  if (!user.active) {
    throw httpError(409, 'This account is deactivated. Reactivate it before sending an invitation.')
  }
  const org = await findOrganization(caller.organizationId)
  await sendInvitation({ ...user, organizationId: caller.organizationId }, org.name)
  await writeAudit(useDb(), caller, { entityType: 'user', entityId: id, action: 'invitation-sent' })
  return { sent: true, to: user.email }
})
