import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { Client, signedIn } from '../support/http'
import { closeTestDb, createOrganization } from '../support/fixtures'
import type { FixtureOrganization } from '../support/fixtures'

let org: FixtureOrganization
beforeAll(async () => {
  org = await createOrganization('Auth')
})
afterAll(closeTestDb)

describe('sign-in', () => {
  it('signs in with the right e-mail and password and knows who you are', async () => {
    const client = new Client()
    const reply = await client.post('/api/auth/sign-in', { email: org.users.tester.email, password: org.users.tester.password })
    expect(reply.status).toBe(200)
    expect(reply.headers.getSetCookie().join(';')).toMatch(/sealwright-session=/)
    const me = await client.get('/api/auth/me')
    expect(me.status).toBe(200)
    expect(me.body).toMatchObject({ email: org.users.tester.email, role: 'tester', organizationId: org.id })
  })

  it('accepts the e-mail in any letter case', async () => {
    const client = new Client()
    const reply = await client.post('/api/auth/sign-in', { email: org.users.reviewer.email.toUpperCase(), password: org.users.reviewer.password })
    expect(reply.status).toBe(200)
  })

  it('gives one generic message for a wrong password and for an unknown e-mail', async () => {
    const wrongPassword = await new Client().post('/api/auth/sign-in', { email: org.users.tester.email, password: 'not-the-password' })
    const unknownEmail = await new Client().post('/api/auth/sign-in', { email: 'nobody@fixture.example', password: 'whatever-it-is' })
    expect(wrongPassword.status).toBe(401)
    expect(unknownEmail.status).toBe(401)
    expect(wrongPassword.body.message).toBe(unknownEmail.body.message)
    expect(wrongPassword.body.message).not.toMatch(/password is wrong|no such/i)
  })

  it('names each missing field', async () => {
    const reply = await new Client().post('/api/auth/sign-in', { email: 'not-an-address', password: '' })
    expect(reply.status).toBe(400)
    expect(reply.body.data.fieldErrors).toEqual({
      email: expect.stringMatching(/valid e-mail/i),
      password: expect.stringMatching(/enter your password/i)
    })
  })

  it('signs out: the session no longer opens anything', async () => {
    const client = await signedIn(org.users.trainer.email, org.users.trainer.password)
    expect((await client.get('/api/overview')).status).toBe(200)
    expect((await client.post('/api/auth/sign-out')).status).toBe(200)
    expect((await client.get('/api/overview')).status).toBe(401)
  })
})

describe('attempt limits', () => {
  // Limits from server/utils/limiter.ts (LIMITS): common practice (no published source).
  it('after five wrong passwords from one address, that address waits; the owner elsewhere still signs in', async () => {
    const victim = (await createOrganization('Throttle')).users.wearer
    const attacker = new Client()
    for (let i = 0; i < 5; i++) {
      expect((await attacker.post('/api/auth/sign-in', { email: victim.email, password: `wrong-${i}-password` })).status).toBe(401)
    }
    const locked = await attacker.post('/api/auth/sign-in', { email: victim.email, password: victim.password })
    expect(locked.status).toBe(429)
    expect(Number(locked.headers.get('retry-after'))).toBeGreaterThan(0)
    expect(locked.body.message).toMatch(/try again in \d+ minute/i)
    // Five wrong passwords, each from a different address, lock nobody out.
    for (let i = 0; i < 5; i++) {
      expect((await new Client().post('/api/auth/sign-in', { email: victim.email, password: `other-${i}-password` })).status).toBe(401)
    }
    expect((await new Client().post('/api/auth/sign-in', { email: victim.email, password: victim.password })).status).toBe(200)
  })

  it('an address trying many e-mails is stopped after a generous limit; other addresses are not', async () => {
    const client = new Client()
    const statuses: number[] = []
    for (let batch = 0; batch < 6; batch++) {
      const replies = await Promise.all(Array.from({ length: 10 }, (_, i) => client.post('/api/auth/sign-in', { email: `guess${batch}-${i}@fixture.example`, password: 'guessing-password' })))
      statuses.push(...replies.map(r => r.status))
    }
    expect(statuses.filter(s => s === 401).length).toBeGreaterThanOrEqual(50)
    expect((await client.post('/api/auth/sign-in', { email: 'one-more@fixture.example', password: 'guessing-password' })).status).toBe(429)
    expect((await new Client().post('/api/auth/sign-in', { email: org.users.admin.email, password: org.users.admin.password })).status).toBe(200)
  })

  it('anonymous reset requests never lock the account', async () => {
    const victim = (await createOrganization('ResetFlood')).users.tester
    const flooder = new Client()
    for (let i = 0; i < 8; i++) {
      const reply = await flooder.post('/api/auth/password-reset', { email: victim.email })
      expect(reply.status).toBe(200)
    }
    expect((await flooder.post('/api/auth/sign-in', { email: victim.email, password: victim.password })).status).toBe(200)
  })
})

describe('deactivated users', () => {
  it('cannot sign in, and a session they already hold stops working', async () => {
    const local = await createOrganization('Deactivate')
    const wearer = await signedIn(local.users.wearer.email, local.users.wearer.password)
    const admin = await signedIn(local.users.admin.email, local.users.admin.password)
    expect((await wearer.get('/api/overview')).status).toBe(200)

    expect((await admin.patch(`/api/users/${local.users.wearer.id}`, { active: false })).status).toBe(200)

    const after = await wearer.get('/api/overview')
    expect(after.status).toBe(401)
    expect(after.body.message).toMatch(/no longer active/i)
    const again = await new Client().post('/api/auth/sign-in', { email: local.users.wearer.email, password: local.users.wearer.password })
    expect(again.status).toBe(401)
  })
})

describe('health', () => {
  it('reports that the database answers', async () => {
    const reply = await new Client().get('/api/health')
    expect(reply.status).toBe(200)
    expect(reply.body).toMatchObject({ status: 'ok', database: 'up' })
  })
})
