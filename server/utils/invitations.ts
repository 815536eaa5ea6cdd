import { ROLE_LABELS } from '#shared/utils/roles'
import type { Role } from '#shared/utils/roles'

/** Issues an invitation link and mails it; the user chooses their own password from the link. */
export async function sendInvitation(user: { id: string, organizationId: string, email: string, displayName: string, role: Role }, organizationName: string) {
  const { token, expiresAt } = await issueToken(user, 'invitation')
  await sendMail({
    organizationId: user.organizationId,
    to: user.email,
    subject: `You are invited to ${organizationName} on Sealwright`,
    text: [
      `Hello ${user.displayName},`,
      '',
      `${organizationName} has given you a Sealwright account as ${ROLE_LABELS[user.role]}.`,
      'To choose your password and sign in, open:',
      appUrl(`/set-password?token=${token}`),
      '',
      `The link works once and expires on ${expiresAt.toUTCString()}.`
    ].join('\n')
  })
}
