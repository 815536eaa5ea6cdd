import { createHash, randomBytes } from 'node:crypto'
import { and, eq, gt, isNull } from 'drizzle-orm'
import type { TokenPurpose } from '#shared/utils/enums'

export const TOKEN_LIFETIME_HOURS: Record<TokenPurpose, number> = {
  'invitation': 72,
  'password-reset': 1
}

export function hashToken(token: string) {
  return createHash('sha256').update(token).digest('hex')
}

/** Issues a single-use link token; only its SHA-256 is stored, so a database copy cannot be replayed. */
export async function issueToken(user: { id: string, organizationId: string }, purpose: TokenPurpose) {
  const token = randomBytes(32).toString('base64url')
  const expiresAt = new Date(Date.now() + TOKEN_LIFETIME_HOURS[purpose] * 3600_000)
  await useDb().insert(schema.authTokens).values({
    organizationId: user.organizationId,
    userId: user.id,
    purpose,
    tokenHash: hashToken(token),
    expiresAt
  })
  return { token, expiresAt }
}

/** The live token row with its user, or null when unknown, used or expired. */
export async function findLiveToken(token: string) {
  const [row] = await useDb()
    .select({ token: schema.authTokens, user: schema.users })
    .from(schema.authTokens)
    .innerJoin(schema.users, eq(schema.users.id, schema.authTokens.userId))
    .where(and(
      eq(schema.authTokens.tokenHash, hashToken(token)),
      isNull(schema.authTokens.usedAt),
      gt(schema.authTokens.expiresAt, new Date())
    ))
  return row ?? null
}
