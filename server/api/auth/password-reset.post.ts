import { passwordResetRequestSchema } from '#shared/utils/user-schemas'

// Same answer whether or not the address has an account, so the form cannot be used to probe for users.
const ANSWER = { sent: true, message: 'If that address has an active account, a reset link is on its way. It works once, for one hour.' }

export default defineEventHandler(async (event) => {
  const { email } = await parseBody(event, passwordResetRequestSchema)
  const keys = { email, address: clientAddress(event) }
  await assertNotThrottled(event, keys)
  // Each request counts as a failure for throttling, so the form cannot flood a mailbox.
  await recordSignInFailure(keys)

  const user = await findUserByEmail(email)
  if (!user || !user.active) return ANSWER
  const { token } = await issueToken(user, 'password-reset')
  await sendMail({
    organizationId: user.organizationId,
    to: user.email,
    subject: 'Reset your Sealwright password',
    text: [
      `Hello ${user.displayName},`,
      '',
      'Someone asked to reset the password of your Sealwright account. To choose a new one, open:',
      appUrl(`/set-password?token=${token}`),
      '',
      'The link works once and expires in one hour. If you did not ask for it, ignore this message.'
    ].join('\n')
  })
  return ANSWER
})
