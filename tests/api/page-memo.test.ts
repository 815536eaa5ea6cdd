// The page memo (server/utils/page-memo.ts) sends a signed-in page again only while the database
// holds what it held when the page was drawn, only to the cookie it was drawn for, and never with
// the nonce or headers of another response.
// Source for every expectation here: common practice (no published source) — a cached page must
// never show older data than a fresh one, never cross users, and a CSP nonce is single-use.
import { eq } from 'drizzle-orm'
import { afterAll, describe, expect, it } from 'vitest'
import * as schema from '../../server/database/schema'
import { Client, signedIn } from '../support/http'
import { closeTestDb, createOrganization, createProgram, testDb } from '../support/fixtures'

afterAll(closeTestDb)

const nonceOf = (csp: string | null) => /'nonce-([^']+)'/.exec(csp ?? '')?.[1]
const page = (client: Client, path: string) => client.fetch('GET', path)

/**
 * Asks for `path` twice in a row until the second answer comes from the memo. Other test files
 * write to the same database all the while, and any write between the two asks rightly makes the
 * second one drawn afresh, so this tries until a pair falls between writes.
 */
async function keptPair(client: Client, path: string) {
  for (let attempt = 0; attempt < 200; attempt++) {
    const drawn = await page(client, path)
    const drawnHtml = await drawn.text()
    const kept = await page(client, path)
    const keptHtml = await kept.text()
    if (kept.headers.get('x-sealwright-page') === 'kept') return { drawn, drawnHtml, kept, keptHtml }
  }
  throw new Error(`${path} was never sent from the memo in 200 tries`)
}

describe('pages sent again from the memo', () => {
  it('a page sent again carries its own nonce in the HTML and the policy, and every other header as drawn', async () => {
    const org = await createOrganization('MemoNonce')
    const program = await createProgram(org)
    const tester = await signedIn(org.users.tester.email, org.users.tester.password)
    const { drawn, drawnHtml, kept, keptHtml } = await keptPair(tester, `/people/${program.personId}`)

    expect(kept.status).toBe(200)
    const drawnNonce = nonceOf(drawn.headers.get('content-security-policy'))
    const keptNonce = nonceOf(kept.headers.get('content-security-policy'))
    expect(drawnNonce).toBeTruthy()
    expect(keptNonce).toBeTruthy()
    expect(keptNonce).not.toBe(drawnNonce)
    expect(keptHtml).toContain(`nonce="${keptNonce}"`)
    expect(keptHtml).not.toContain(drawnNonce!)
    expect(keptHtml.replaceAll(keptNonce!, 'N')).toBe(drawnHtml.replaceAll(drawnNonce!, 'N'))
    for (const name of ['content-type', 'x-frame-options', 'x-content-type-options', 'referrer-policy', 'permissions-policy', 'cache-control']) {
      expect(kept.headers.get(name), name).toBe(drawn.headers.get(name))
    }
    expect(kept.headers.get('content-security-policy')!.replace(keptNonce!, 'N')).toBe(drawn.headers.get('content-security-policy')!.replace(drawnNonce!, 'N'))
    expect(kept.headers.getSetCookie()).toEqual([])
  })

  it('a change saved through the app is on the next page, never the page drawn before it', async () => {
    const org = await createOrganization('MemoWrite')
    const program = await createProgram(org)
    const admin = await signedIn(org.users.admin.email, org.users.admin.password)
    const path = `/people/${program.personId}`
    await keptPair(admin, path)

    const renamed = await admin.patch(`/api/people/${program.personId}`, { fullName: 'Rowan Renamedwell' })
    expect(renamed.status).toBe(200)
    const after = await page(admin, path)
    expect(after.headers.get('x-sealwright-page')).not.toBe('kept')
    expect(await after.text()).toContain('Rowan Renamedwell')
  })

  it('a change written to the database by anything else is on the next page too', async () => {
    const org = await createOrganization('MemoOutside')
    const program = await createProgram(org)
    const tester = await signedIn(org.users.tester.email, org.users.tester.password)
    const path = `/people/${program.personId}`
    await keptPair(tester, path)

    await testDb().update(schema.people).set({ fullName: 'Rowan Elsewhere' }).where(eq(schema.people.id, program.personId))
    const after = await page(tester, path)
    expect(after.headers.get('x-sealwright-page')).not.toBe('kept')
    expect(await after.text()).toContain('Rowan Elsewhere')
  })

  it('a page drawn for one person is never sent to another, even for the same address', async () => {
    const org = await createOrganization('MemoPeople')
    const tester = await signedIn(org.users.tester.email, org.users.tester.password)
    const reviewer = await signedIn(org.users.reviewer.email, org.users.reviewer.password)
    await keptPair(tester, '/fit-tests')

    const other = await page(reviewer, '/fit-tests')
    expect(other.status).toBe(200)
    const html = await other.text()
    expect(html).toContain(org.users.reviewer.email)
    expect(html).not.toContain(org.users.tester.email)
  })

  it('a cookie that no longer holds is sent to sign in, not the page kept for it', async () => {
    const org = await createOrganization('MemoEnded')
    const laptop = await signedIn(org.users.tester.email, org.users.tester.password)
    const copied = new Client()
    Object.assign(copied, { cookies: new Map((laptop as unknown as { cookies: Map<string, string> }).cookies) })
    await keptPair(copied, '/fit-tests')
    expect((await laptop.post('/api/auth/sign-out-everywhere')).status).toBe(200)

    const after = await page(copied, '/fit-tests')
    expect(after.status).toBe(302)
    expect(after.headers.get('location')).toMatch(/^\/sign-in\?next=/)
  })

  it('a signed-out page and a page that is not found are never kept', async () => {
    const visitor = new Client()
    for (let i = 0; i < 2; i++) expect((await page(visitor, '/sign-in')).headers.get('x-sealwright-page')).toBeNull()
    const org = await createOrganization('MemoMissing')
    const tester = await signedIn(org.users.tester.email, org.users.tester.password)
    for (let i = 0; i < 2; i++) {
      const missing = await page(tester, '/people/00000000-0000-4000-8000-000000000000')
      expect(missing.status).toBe(404)
      expect(missing.headers.get('x-sealwright-page')).toBeNull()
    }
  })
})
