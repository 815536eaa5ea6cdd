import { eq } from 'drizzle-orm'
import { setPasswordSchema, tokenParamSchema } from '#shared/utils/user-schemas'

export default defineEventHandler(async (event) => {
  const { token } = parseParams(event, tokenParamSchema)
  const { password } = await parseBody(event, setPasswordSchema)
  const row = await findLiveToken(token)
  if (!row || !row.user.active) {
    throw httpError(404, 'This link has expired or was already used. Ask for a new one.')
  }
  const passwordHash = await hashPassword(password)
  const user = row.user
  await useDb().transaction(async (tx) => {
    // Spend every open link of this user, not just this one: one password change ends them all.
    await tx.update(schema.authTokens).set({ usedAt: new Date() }).where(eq(schema.authTokens.userId, user.id))
    await tx.update(schema.users).set({ passwordHash, lastSignInAt: new Date() }).where(eq(schema.users.id, user.id))
    await writeAudit(tx, { id: user.id, organizationId: user.organizationId }, {
      entityType: 'user', entityId: user.id, action: row.token.purpose === 'invitation' ? 'invitation-accepted' : 'password-reset'
    })
  })
  await clearSignInFailures(user.email)
  await setUserSession(event, {
    user: { id: user.id, organizationId: user.organizationId, role: user.role, email: user.email, displayName: user.displayName },
    signedInAt: new Date().toISOString()
  })
  return { id: user.id, role: user.role }
})
