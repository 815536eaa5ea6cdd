/**
 * The page memo (server/utils/page-memo.ts) sends a signed-in page again to a request with the same
 * address, host, cookies, minute and database snapshot. That is only safe while nothing else about
 * the request can change what a page shows: a page that read another header (a language, the
 * agent) through Nuxt's request composables would need that header in the memo's key first.
 * Source: our own code rules (no published source).
 */
import { readdirSync, readFileSync } from 'node:fs'
import { join, relative } from 'node:path'
import { describe, expect, it } from 'vitest'

const ROOT = join(import.meta.dirname, '..', '..')
const APP = join(ROOT, 'app')
const REQUEST_READS = /\buse(RequestHeaders?|RequestEvent|RequestURL)\b|\bgetRequest\w*\(/
// Files that read the request, and what they read: each is covered by the memo's key.
const READERS: Record<string, string> = {
  'app/plugins/00.page-start.server.ts': 'the session and clock zone the page middleware read from the cookie',
  'app/plugins/page-memo.server.ts': 'whether the render failed, to refuse keeping it'
}

describe('what a page is drawn from is in the page memo key', () => {
  it('no page, component or composable reads the request except the files listed here', () => {
    const offenders = readdirSync(APP, { recursive: true, encoding: 'utf8' })
      .filter(name => /\.(vue|ts)$/.test(name))
      .map(name => relative(ROOT, join(APP, name)).split('\\').join('/'))
      .filter(file => !(file in READERS) && REQUEST_READS.test(readFileSync(join(ROOT, file), 'utf8')))
    expect(offenders, 'add what these read to the key in server/utils/page-memo.ts, then list them here').toEqual([])
  })

  it('finds the reads it is meant to find', () => {
    for (const line of ['useRequestHeaders([\'accept-language\'])', 'useRequestHeader(\'user-agent\')', 'useRequestURL().host', 'useRequestEvent()?.node', 'getRequestHeader(event, \'x\')']) {
      expect(REQUEST_READS.test(line), line).toBe(true)
    }
  })
})
