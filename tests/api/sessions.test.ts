// Sessions end when they should: sign-out everywhere, a password reset and deactivation end every
// copy of a user's cookie, and reactivation does not bring them back. Links are single-use even
// when used many times at once.
import { afterAll, describe, expect, it } from 'vitest'
import { Client, signedIn } from '../support/http'
import { closeTestDb, createOrganization } from '../support/fixtures'
import { latestMailTo, linkTokenOf } from '../support/outbox'

afterAll(closeTestDb)

/** A second client holding a copy of `client`'s cookie, as a stolen or forgotten browser would. */
function copyOf(client: Client) {
  const copy = new Client()
  Object.assign(copy, { cookies: new Map((client as unknown as { cookies: Map<string, string> }).cookies) })
  return copy
}

describe('ending sessions', () => {
  it('sign-out everywhere ends every copy of the session, not only this one', async () => {
    const org = await createOrganization('Everywhere')
    const laptop = await signedIn(org.users.tester.email, org.users.tester.password)
    const phone = await signedIn(org.users.tester.email, org.users.tester.password)
    const copied = copyOf(laptop)
    expect((await copied.get('/api/auth/me')).status).toBe(200)

    expect((await laptop.post('/api/auth/sign-out-everywhere')).status).toBe(200)
    for (const client of [laptop, phone, copied]) {
      const reply = await client.get('/api/auth/me')
      expect(reply.status).toBe(401)
    }
    // Signing in again works and gives a live session.
    const fresh = await signedIn(org.users.tester.email, org.users.tester.password)
    expect((await fresh.get('/api/auth/me')).status).toBe(200)
  })

  it('a password reset ends every session of the user, copies included', async () => {
    const org = await createOrganization('Reset')
    const user = org.users.reviewer
    const old = await signedIn(user.email, user.password)
    const copied = copyOf(old)

    expect((await new Client().post('/api/auth/password-reset', { email: user.email })).status).toBe(200)
    const token = linkTokenOf(await latestMailTo(user.email, 10_000))
    const visitor = new Client()
    const set = await visitor.post(`/api/auth/tokens/${token}`, { password: 'a-new-password-1', confirm: 'a-new-password-1' })
    expect(set.status).toBe(200)

    expect((await old.get('/api/auth/me')).status).toBe(401)
    expect((await copied.get('/api/auth/me')).status).toBe(401)
    expect((await visitor.get('/api/auth/me')).status).toBe(200)
  })

  it('deactivation ends sessions and reactivation does not revive them', async () => {
    const org = await createOrganization('Reactivate')
    const admin = await signedIn(org.users.admin.email, org.users.admin.password)
    const wearer = await signedIn(org.users.wearer.email, org.users.wearer.password)
    const copied = copyOf(wearer)

    expect((await admin.patch(`/api/users/${org.users.wearer.id}`, { active: false })).status).toBe(200)
    expect((await admin.patch(`/api/users/${org.users.wearer.id}`, { active: true })).status).toBe(200)

    expect((await copied.get('/api/auth/me')).status).toBe(401)
    expect((await wearer.get('/api/auth/me')).status).toBe(401)
    const again = await signedIn(org.users.wearer.email, org.users.wearer.password)
    expect((await again.get('/api/auth/me')).status).toBe(200)
  })
})

describe('opened sessions kept for a minute', () => {
  // Source for the expectation: common practice (no published source) — a cookie opens to the
  // session it was sealed with, whatever another request did while carrying it.
  it('signing in as someone else while carrying an old cookie does not change what the old cookie opens to', async () => {
    const org = await createOrganization('Kept')
    const tester = await signedIn(org.users.tester.email, org.users.tester.password)
    // The tester's cookie has been opened (and kept) by these requests.
    expect(((await tester.get('/api/auth/me')).body as { email: string }).email).toBe(org.users.tester.email)
    const oldCookie = copyOf(tester)
    // The same browser signs in as the reviewer; that request carried the tester's cookie.
    expect((await tester.post('/api/auth/sign-in', { email: org.users.reviewer.email, password: org.users.reviewer.password })).status).toBe(200)
    expect(((await tester.get('/api/auth/me')).body as { email: string }).email).toBe(org.users.reviewer.email)
    // The old cookie still opens to the tester, never to the reviewer.
    const me = await oldCookie.get('/api/auth/me')
    if (me.status === 200) expect((me.body as { email: string }).email).toBe(org.users.tester.email)
    else expect(me.status).toBe(401)
    const session = await oldCookie.get('/api/_auth/session')
    expect(JSON.stringify(session.body)).not.toContain(org.users.reviewer.email)
  })
})

describe('single-use links', () => {
  it('ten uses of one reset link at once: exactly one sets the password', async () => {
    const org = await createOrganization('Race')
    const user = org.users.trainer
    expect((await new Client().post('/api/auth/password-reset', { email: user.email })).status).toBe(200)
    const token = linkTokenOf(await latestMailTo(user.email, 10_000))

    const replies = await Promise.all(Array.from({ length: 10 }, (_, i) =>
      new Client().post(`/api/auth/tokens/${token}`, { password: `racing-password-${i}`, confirm: `racing-password-${i}` })))
    const statuses = replies.map(r => r.status).sort()
    expect(statuses.filter(s => s === 200)).toHaveLength(1)
    expect(statuses.filter(s => s === 404)).toHaveLength(9)

    const winner = replies.findIndex(r => r.status === 200)
    expect((await new Client().post('/api/auth/sign-in', { email: user.email, password: `racing-password-${winner}` })).status).toBe(200)
  })

  it('ten uses of one invitation at once: exactly one is accepted', async () => {
    const org = await createOrganization('InviteRace')
    const admin = await signedIn(org.users.admin.email, org.users.admin.password)
    const email = `invitee.${Date.now()}@fixture.example`
    expect((await admin.post('/api/users', { email, displayName: 'Invited Person', role: 'wearer' })).status).toBe(201)
    const token = linkTokenOf(await latestMailTo(email))

    const replies = await Promise.all(Array.from({ length: 10 }, () =>
      new Client().post(`/api/auth/tokens/${token}`, { password: 'invited-password', confirm: 'invited-password' })))
    expect(replies.filter(r => r.status === 200)).toHaveLength(1)
    expect(replies.filter(r => r.status === 404)).toHaveLength(9)
  })
})

describe('what an answer gives away', () => {
  it('a reset request answers the same for a known and an unknown address', async () => {
    const org = await createOrganization('Probe')
    const known = await new Client().post('/api/auth/password-reset', { email: org.users.tester.email })
    const unknown = await new Client().post('/api/auth/password-reset', { email: 'nobody-here@fixture.example' })
    expect(known.status).toBe(unknown.status)
    expect(known.body).toEqual(unknown.body)
  })

  it('an administrator can add an address another organization uses, without learning that it does', async () => {
    const first = await createOrganization('HolderA')
    const second = await createOrganization('HolderB')
    const admin = await signedIn(second.users.admin.email, second.users.admin.password)
    const reply = await admin.post('/api/users', { email: first.users.tester.email, displayName: 'Visiting Tester', role: 'tester' })
    expect(reply.status).toBe(201)
    // The account of the first organization still signs in with its own password.
    const signIn = await new Client().post('/api/auth/sign-in', { email: first.users.tester.email, password: first.users.tester.password })
    expect(signIn.status).toBe(200)
    expect(signIn.body.id).toBe(first.users.tester.id)
  })
})

describe('a page starts from its own request', () => {
  // Source for the expectations: common practice (no published source) — a page shows who is
  // signed in as the API would, and a cookie the API refuses does not draw a signed-in page.
  const sessionCookie = (response: Response) => response.headers.getSetCookie().find(line => line.startsWith('sealwright-session='))

  it('a signed-out page makes no session', async () => {
    const visitor = new Client()
    const page = await visitor.fetch('GET', '/sign-in')
    expect(page.status).toBe(200)
    expect(sessionCookie(page)).toBeUndefined()
  })

  it('a signed-in page is drawn for the user the cookie names', async () => {
    const org = await createOrganization('PageStart')
    const tester = await signedIn(org.users.tester.email, org.users.tester.password)
    const page = await tester.fetch('GET', '/fit-tests')
    expect(page.status).toBe(200)
    expect(await page.text()).toContain(org.users.tester.email)
  })

  it('a page asked with a cookie that no longer holds clears it and sends the person to sign in', async () => {
    const org = await createOrganization('PageEnded')
    const laptop = await signedIn(org.users.tester.email, org.users.tester.password)
    const copied = copyOf(laptop)
    expect((await copied.fetch('GET', '/fit-tests')).status).toBe(200)
    expect((await laptop.post('/api/auth/sign-out-everywhere')).status).toBe(200)

    const page = await copied.fetch('GET', '/fit-tests')
    expect(page.status).toBe(302)
    expect(page.headers.get('location')).toMatch(/^\/sign-in\?next=/)
    // Cleared: an empty value (h3's way), or one already expired.
    expect(sessionCookie(page)).toMatch(/^sealwright-session=;|max-age=0|expires=thu, 01 jan 1970/i)
  })
})
