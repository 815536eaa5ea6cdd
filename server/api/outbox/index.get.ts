interface CapturedMail {
  id: string
  receivedAt: string
  from: string
  to: string[]
  subject: string
  text: string
  headers: Record<string, string>
}

/** The demo outbox: mail captured by the local fake SMTP server, only this organization's. */
export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'administer')
  const url = useRuntimeConfig(event).mail.outboxUrl
  if (!url) {
    throw httpError(404, 'There is no outbox here: mail goes to a real SMTP server.')
  }
  let messages: CapturedMail[]
  try {
    messages = await $fetch<CapturedMail[]>(`${url.replace(/\/$/, '')}/messages`, { timeout: 3000 })
  } catch {
    throw httpError(503, 'The local mail catcher does not answer. Is `npm start` still running?')
  }
  return messages
    .filter(m => m.headers['x-sealwright-organization'] === caller.organizationId)
    .map(({ headers: _headers, ...m }) => m)
})
