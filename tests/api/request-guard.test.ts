// Headers every answer carries, the body limit and the refusal of cross-site state changes.
import { afterAll, describe, expect, it } from 'vitest'
import { Client, signedIn } from '../support/http'
import { closeTestDb, createOrganization } from '../support/fixtures'
import { baseUrl } from '../support/env'

afterAll(closeTestDb)

function post(path: string, body: string, headers: Record<string, string> = {}) {
  return fetch(new URL(path, baseUrl), { method: 'POST', headers: { 'content-type': 'application/json', ...headers }, body })
}

describe('response headers', () => {
  it('a page carries a policy that forbids framing and inline scripts, and says nothing about the server', async () => {
    const response = await fetch(new URL('/sign-in', baseUrl))
    const policy = response.headers.get('content-security-policy') ?? ''
    expect(policy).toMatch(/frame-ancestors 'none'/)
    expect(policy).toMatch(/object-src 'none'/)
    const scriptSrc = policy.split(';').find(d => d.trim().startsWith('script-src ')) ?? ''
    expect(scriptSrc).toMatch(/'nonce-[^']+'/)
    expect(scriptSrc).not.toMatch(/unsafe-inline|unsafe-eval/)
    expect(response.headers.get('x-content-type-options')).toBe('nosniff')
    expect(response.headers.get('x-frame-options')).toBe('DENY')
    expect(response.headers.get('referrer-policy')).toBe('strict-origin-when-cross-origin')
    expect(response.headers.get('x-powered-by')).toBeNull()
  })

  it('an API answer carries nosniff and no X-Powered-By either', async () => {
    const response = await fetch(new URL('/api/health', baseUrl))
    expect(response.headers.get('x-content-type-options')).toBe('nosniff')
    expect(response.headers.get('x-powered-by')).toBeNull()
  })
})

describe('body limit', () => {
  it('refuses an anonymous body over 2 MB with 413 and a sentence, before reading it', async () => {
    const response = await post('/api/auth/sign-in', JSON.stringify({ email: 'x@fixture.example', password: 'a'.repeat(3 * 1024 * 1024) }))
    expect(response.status).toBe(413)
    expect((await response.json()).message).toMatch(/larger than 2 MB; nothing was saved/)
  })

  it('lets a fit test carry a count series over 2 MB of JSON up to its own limit', async () => {
    const org = await createOrganization('Limits')
    const tester = await signedIn(org.users.tester.email, org.users.tester.password)
    // 2.5 MB of JSON: over the general limit, under the series routes' 8 MB; the schema answers instead.
    const reply = await tester.post('/api/fit-tests', { seriesText: 'x'.repeat(2_500_000) })
    expect(reply.status).toBe(400)
    const elsewhere = await tester.post('/api/people', { fullName: 'x'.repeat(2_500_000) })
    expect(elsewhere.status).toBe(413)
  })
})

describe('cross-site requests', () => {
  it('refuses a state change sent by a page on another site, by Origin or by Sec-Fetch-Site', async () => {
    const org = await createOrganization('CrossSite')
    const byOrigin = await post('/api/auth/sign-in', JSON.stringify({ email: org.users.admin.email, password: org.users.admin.password }), { origin: 'https://elsewhere.example' })
    expect(byOrigin.status).toBe(403)
    expect((await byOrigin.json()).message).toMatch(/another website/)
    const byFetchSite = await post('/api/auth/sign-in', JSON.stringify({ email: org.users.admin.email, password: org.users.admin.password }), { 'sec-fetch-site': 'cross-site' })
    expect(byFetchSite.status).toBe(403)
    const sandboxed = await post('/api/auth/sign-in', JSON.stringify({ email: org.users.admin.email, password: org.users.admin.password }), { origin: 'null' })
    expect(sandboxed.status).toBe(403)
  })

  it('accepts the same request from the app itself', async () => {
    const org = await createOrganization('SameSite')
    const reply = await post('/api/auth/sign-in', JSON.stringify({ email: org.users.admin.email, password: org.users.admin.password }), { 'origin': new URL(baseUrl).origin, 'sec-fetch-site': 'same-origin', 'x-forwarded-for': new Client().address })
    expect(reply.status).toBe(200)
  })
})
