import nodemailer from 'nodemailer'
import type { Transporter } from 'nodemailer'

let transporter: Transporter | undefined

function useTransport() {
  // Bounded waits: a mail server that stops answering fails the send (logged on the reminder)
  // instead of holding the request that asked for it.
  transporter ??= nodemailer.createTransport({ url: useRuntimeConfig().mail.smtpUrl, connectionTimeout: 10_000, greetingTimeout: 10_000, socketTimeout: 20_000 })
  return transporter
}

export interface OutgoingMail {
  organizationId: string
  to: string
  subject: string
  text: string
}

/** Sends through SMTP. The organization header lets the demo outbox show each admin only their own mail. */
export async function sendMail(mail: OutgoingMail) {
  const config = useRuntimeConfig()
  await useTransport().sendMail({
    from: config.mail.from,
    to: mail.to,
    subject: mail.subject,
    text: mail.text,
    headers: { 'X-Sealwright-Organization': mail.organizationId }
  })
}

export function appUrl(path: string) {
  return new URL(path, useRuntimeConfig().public.baseUrl).toString()
}
