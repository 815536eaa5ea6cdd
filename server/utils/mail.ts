import nodemailer from 'nodemailer'
import type { Transporter } from 'nodemailer'

let transporter: Transporter | undefined

function useTransport() {
  transporter ??= nodemailer.createTransport(useRuntimeConfig().mail.smtpUrl)
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
