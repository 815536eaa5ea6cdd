import { outboxUrl } from './env'

export interface CapturedMail {
  to: string[]
  subject: string
  text: string
}

/** The newest message the mail catcher holds for `to`, waiting briefly for it to arrive. */
export async function latestMailTo(to: string, timeoutMs = 5000): Promise<CapturedMail> {
  const deadline = Date.now() + timeoutMs
  while (Date.now() < deadline) {
    const list = await (await fetch(`${outboxUrl}/messages?to=${encodeURIComponent(to)}`)).json() as CapturedMail[]
    if (list.length) return list[0]!
    await new Promise(resolve => setTimeout(resolve, 100))
  }
  throw new Error(`No mail arrived for ${to}`)
}

export function linkTokenOf(mail: CapturedMail) {
  const match = mail.text.match(/set-password\?token=([\w-]+)/)
  if (!match) throw new Error(`No link in: ${mail.text}`)
  return match[1]!
}
