import { eq } from 'drizzle-orm'
import { signInSchema } from '#shared/utils/user-schemas'

// One message for every wrong e-mail or password, so the form never tells which part was wrong.
const GENERIC_FAILURE = 'That e-mail and password do not match an active account.'

export default defineEventHandler(async (event) => {
  const { email, password } = await parseBody(event, signInSchema)
  const keys = { email, address: clientAddress(event) }
  await assertSignInAllowed(event, keys)

  // One address may hold accounts in several organizations; the password picks the account.
  // A hash is always checked, so an unknown address takes as long as a known one.
  const candidates = (await findUsersByEmail(email)).filter(u => u.active && u.passwordHash)
  const user = await firstMatching(candidates, password)
  if (!user) {
    await recordSignInFailure(keys)
    throw httpError(401, GENERIC_FAILURE)
  }

  await clearSignInFailures(keys)
  await useDb().update(schema.users).set({ lastSignInAt: new Date() }).where(eq(schema.users.id, user.id))
  await startSession(event, user)
  return { id: user.id, role: user.role, displayName: user.displayName }
})

async function firstMatching<T extends { passwordHash: string | null }>(candidates: T[], password: string) {
  if (candidates.length === 0) {
    await verifyPassword(await decoyHash(), password)
    return null
  }
  for (const candidate of candidates) {
    if (await verifyPassword(candidate.passwordHash!, password)) return candidate
  }
  return null
}
