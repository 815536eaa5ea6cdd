import { and, eq } from 'drizzle-orm'
import { linkPersonSchema } from '#shared/utils/oversight-schemas'
import { idParamSchema } from '#shared/utils/user-schemas'

/**
 * Links a roster entry to a wearer account: an existing one (`userId`), or a new account invited
 * by e-mail (`invite`). One account per roster entry and one roster entry per account.
 */
export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'administer')
  const { id } = parseParams(event, idParamSchema)
  const input = await parseBody(event, linkPersonSchema)
  const person = await findPerson(caller.organizationId, id)
  if (person.userId) throw httpError(409, 'This person is already linked to an account. Unlink it first.')
  const u = schema.users
  let user: { id: string, email: string, role: string } | undefined
  if ('userId' in input) {
    [user] = await useDb().select({ id: u.id, email: u.email, role: u.role }).from(u).where(and(eq(u.organizationId, caller.organizationId), eq(u.id, input.userId)))
    if (!user) throw httpError(400, 'Choose a wearer account of your organization.', { fieldErrors: { userId: 'Choose a wearer account of your organization.' } })
    if (user.role !== 'wearer') throw httpError(400, 'Only a wearer account can be linked to a roster entry.', { fieldErrors: { userId: 'Choose a wearer account.' } })
  } else {
    const email = input.email ?? person.email
    if (!email) throw httpError(400, 'This person has no e-mail address: enter one to invite them.', { fieldErrors: { email: 'Enter the e-mail address to invite.' } })
    const [taken] = await useDb().select({ id: u.id }).from(u).where(eq(u.email, email))
    if (taken) throw httpError(409, 'An account with this e-mail address already exists: link it instead.', { fieldErrors: { email: 'An account with this address exists.' } })
    const [created] = await useDb().insert(u).values({ organizationId: caller.organizationId, email, displayName: person.fullName, role: 'wearer' }).returning()
    user = created!
    const org = await findOrganization(caller.organizationId)
    await sendInvitation({ id: created!.id, organizationId: caller.organizationId, email, displayName: person.fullName, role: 'wearer' }, org.name)
  }
  const [taken] = await useDb().select({ id: schema.people.id }).from(schema.people).where(and(eq(schema.people.organizationId, caller.organizationId), eq(schema.people.userId, user.id)))
  if (taken) throw httpError(409, 'That account is already linked to another roster entry.', { fieldErrors: { userId: 'Already linked to someone else.' } })
  await useDb().transaction(async (tx) => {
    await tx.update(schema.people).set({ userId: user.id }).where(and(eq(schema.people.organizationId, caller.organizationId), eq(schema.people.id, id)))
    await writeAudit(tx, caller, { entityType: 'person', entityId: id, action: 'account-linked', after: { userId: user.id, email: user.email, invited: !('userId' in input) } })
  })
  return { personId: id, userId: user.id, email: user.email }
})
