import { and, eq, gt, isNull } from 'drizzle-orm'
import { setPasswordSchema, tokenParamSchema } from '#shared/utils/user-schemas'

const SPENT = 'This link has expired or was already used. Ask for a new one.'

export default defineEventHandler(async (event) => {
  const { token } = parseParams(event, tokenParamSchema)
  const { password } = await parseBody(event, setPasswordSchema)
  const passwordHash = await hashPassword(password)
  const t = schema.authTokens

  const user = await useDb().transaction(async (tx) => {
    // Spending the link is the first statement: of several uses at once, exactly one gets the row.
    const [spent] = await tx.update(t).set({ usedAt: new Date() })
      .where(and(eq(t.tokenHash, hashToken(token)), isNull(t.usedAt), gt(t.expiresAt, new Date())))
      .returning({ userId: t.userId, purpose: t.purpose })
    if (!spent) throw httpError(404, SPENT)
    const [owner] = await tx.update(schema.users).set({ passwordHash, lastSignInAt: new Date() })
      .where(and(eq(schema.users.id, spent.userId), eq(schema.users.active, true)))
      .returning()
    if (!owner) throw httpError(404, SPENT)
    // One password change spends every other open link and ends every session of this user.
    await tx.update(t).set({ usedAt: new Date() }).where(and(eq(t.userId, owner.id), isNull(t.usedAt)))
    const sessionVersion = await endAllSessions(tx, owner.id)
    await writeAudit(tx, { id: owner.id, organizationId: owner.organizationId }, {
      entityType: 'user', entityId: owner.id, action: spent.purpose === 'invitation' ? 'invitation-accepted' : 'password-reset'
    })
    return { ...owner, sessionVersion: sessionVersion ?? owner.sessionVersion }
  })
  await startSession(event, user)
  return { id: user.id, role: user.role }
})
