import { eq } from 'drizzle-orm'
import { signInSchema } from '#shared/utils/user-schemas'

// One message for every wrong e-mail or password, so the form never tells which part was wrong.
const GENERIC_FAILURE = 'That e-mail and password do not match an active account.'

export default defineEventHandler(async (event) => {
  const { email, password } = await parseBody(event, signInSchema)
  const keys = { email, address: clientAddress(event) }
  await assertNotThrottled(event, keys)

  const user = await findUserByEmail(email)
  const valid = user?.passwordHash ? await verifyPassword(user.passwordHash, password) : false
  if (!user || !valid || !user.active) {
    await recordSignInFailure(keys)
    throw httpError(401, GENERIC_FAILURE)
  }

  await clearSignInFailures(email)
  const now = new Date()
  await useDb().update(schema.users).set({ lastSignInAt: now }).where(eq(schema.users.id, user.id))
  await setUserSession(event, {
    user: { id: user.id, organizationId: user.organizationId, role: user.role, email: user.email, displayName: user.displayName },
    signedInAt: now.toISOString()
  })
  return { id: user.id, role: user.role, displayName: user.displayName }
})
