import { createUserSchema } from '#shared/utils/user-schemas'

export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'administer')
  const input = await parseBody(event, createUserSchema)
  // Only this organization's accounts are looked at: the same address may hold an account
  // elsewhere, and an administrator must not learn that from this answer.
  if (await findOrganizationUserByEmail(caller.organizationId, input.email)) {
    throw httpError(409, `Your organization already has an account for ${input.email}.`, { fieldErrors: { email: 'This e-mail already has an account in your organization.' } })
  }
  const user = await useDb().transaction(async (tx) => {
    const [created] = await tx.insert(schema.users).values({ ...input, organizationId: caller.organizationId }).returning()
    await writeAudit(tx, caller, { entityType: 'user', entityId: created!.id, action: 'created', after: { email: input.email, displayName: input.displayName, role: input.role } })
    await linkWearerByEmail(tx, caller, created!)
    return created!
  })
  const org = await findOrganization(caller.organizationId)
  await sendInvitation(user, org.name)
  setResponseStatus(event, 201)
  return findUser(caller.organizationId, user.id)
})
