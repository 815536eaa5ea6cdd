import { passwordResetRequestSchema } from '#shared/utils/user-schemas'

// Same answer, at the same speed, whether or not the address has an account, so the form cannot
// be used to probe for users. The lookup and the mail happen after the answer has gone.
const ANSWER = { sent: true, message: 'If that address has an active account, a reset link is on its way. It works once, for one hour.' }

export default defineEventHandler(async (event) => {
  const { email } = await parseBody(event, passwordResetRequestSchema)
  // Only a flood from one connection is refused; a reset request never locks anyone's sign-in.
  await assertResetAllowed(event, clientAddress(event))
  event.waitUntil(sendResetLinks(email).catch((error) => {
    logServerError('password-reset mail', error)
  }))
  return ANSWER
})

async function sendResetLinks(email: string) {
  if (!await resetMailAllowed(email)) return
  const accounts = (await findUsersByEmail(email)).filter(u => u.active)
  for (const user of accounts) {
    const { token } = await issueToken(user, 'password-reset')
    const org = await findOrganization(user.organizationId)
    await sendMail({
      organizationId: user.organizationId,
      to: user.email,
      subject: 'Reset your Sealwright password',
      text: [
        `Hello ${user.displayName},`,
        '',
        `Someone asked to reset the password of your Sealwright account at ${org.name}. To choose a new one, open:`,
        appUrl(`/set-password?token=${token}`),
        '',
        'The link works once and expires in one hour. If you did not ask for it, ignore this message.'
      ].join('\n')
    })
  }
}
