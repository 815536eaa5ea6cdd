import { createUserSchema } from '#shared/utils/user-schemas'

export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'admin')
  const input = await parseBody(event, createUserSchema)
  if (await findUserByEmail(input.email)) {
    throw httpError(409, `An account for ${input.email} already exists.`, { fieldErrors: { email: 'This e-mail already has an account.' } })
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
