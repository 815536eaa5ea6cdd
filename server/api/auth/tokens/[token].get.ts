import { tokenParamSchema } from '#shared/utils/user-schemas'

export default defineEventHandler(async (event) => {
  const { token } = parseParams(event, tokenParamSchema)
  const row = await findLiveToken(token)
  if (!row || !row.user.active) {
    throw httpError(404, 'This link has expired or was already used. Ask for a new one.')
  }
  return { purpose: row.token.purpose, email: row.user.email, displayName: row.user.displayName, expiresAt: row.token.expiresAt }
})
