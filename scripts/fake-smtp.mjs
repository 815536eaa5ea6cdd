// A local stand-in for the SMTP service: accepts every message on loopback, keeps it, and lets the
// app's demo outbox read it back over HTTP. Never relays anything anywhere.
//   SEALWRIGHT_SMTP_PORT (2525), SEALWRIGHT_MAIL_HTTP_PORT (8025), SEALWRIGHT_MAIL_FILE (optional .jsonl to keep mail across restarts)
import { appendFileSync, existsSync, readFileSync, writeFileSync } from 'node:fs'
import { createServer } from 'node:http'
import { randomUUID } from 'node:crypto'
import { SMTPServer } from 'smtp-server'
import { simpleParser } from 'mailparser'

const smtpPort = Number(process.env.SEALWRIGHT_SMTP_PORT || 2525)
const httpPort = Number(process.env.SEALWRIGHT_MAIL_HTTP_PORT || 8025)
const file = process.env.SEALWRIGHT_MAIL_FILE || ''
const KEEP = 500

const messages = file && existsSync(file)
  ? readFileSync(file, 'utf8').split('\n').filter(Boolean).map(line => JSON.parse(line))
  : []

const smtp = new SMTPServer({
  authOptional: true,
  disabledCommands: ['STARTTLS'],
  // Loopback only: a reverse DNS lookup of 127.0.0.1 can stall each connection on a machine without a resolver.
  disableReverseLookup: true,
  banner: 'Sealwright local mail catcher',
  onData(stream, session, callback) {
    simpleParser(stream)
      .then((mail) => {
        const headers = {}
        for (const [key, value] of mail.headers) headers[key] = typeof value === 'string' ? value : JSON.stringify(value)
        const message = {
          id: randomUUID(),
          receivedAt: new Date().toISOString(),
          from: mail.from?.text ?? '',
          to: session.envelope.rcptTo.map(r => r.address),
          subject: mail.subject ?? '',
          text: mail.text ?? '',
          headers
        }
        messages.unshift(message)
        messages.length = Math.min(messages.length, KEEP)
        if (file) appendFileSync(file, `${JSON.stringify(message)}\n`)
        callback()
      })
      .catch(callback)
  }
})
smtp.on('error', error => console.error(`[mail] ${error.message}`))

const http = createServer((req, res) => {
  const url = new URL(req.url, 'http://127.0.0.1')
  if (url.pathname === '/messages' && req.method === 'GET') {
    const to = url.searchParams.get('to')
    const list = to ? messages.filter(m => m.to.includes(to.toLowerCase())) : messages
    res.writeHead(200, { 'content-type': 'application/json' })
    return res.end(JSON.stringify(list))
  }
  if (url.pathname === '/messages' && req.method === 'DELETE') {
    messages.length = 0
    if (file) writeFileSync(file, '')
    res.writeHead(204)
    return res.end()
  }
  if (url.pathname === '/health') {
    res.writeHead(200, { 'content-type': 'application/json' })
    return res.end(JSON.stringify({ ok: true, messages: messages.length }))
  }
  res.writeHead(404)
  res.end()
})

smtp.listen(smtpPort, '127.0.0.1', () => {
  http.listen(httpPort, '127.0.0.1', () => {
    console.log(`[mail] catching SMTP on 127.0.0.1:${smtpPort}, read back on http://127.0.0.1:${httpPort}/messages`)
  })
})

for (const signal of ['SIGINT', 'SIGTERM']) {
  process.on(signal, () => {
    http.close()
    smtp.close(() => process.exit(0))
    setTimeout(() => process.exit(0), 1000).unref()
  })
}
