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

describe('throttling', () => {
  it('locks an e-mail after five failures with 429 and the wait time, even for the right password', async () => {
    const victim = (await createOrganization('Throttle')).users.wearer
    for (let i = 0; i < 5; i++) {
      // A different client address each time: the e-mail alone triggers the lock.
      const reply = await new Client().post('/api/auth/sign-in', { email: victim.email, password: `wrong-${i}-password` })
      expect(reply.status).toBe(401)
    }
    const locked = await new Client().post('/api/auth/sign-in', { email: victim.email, password: victim.password })
    expect(locked.status).toBe(429)
    expect(Number(locked.headers.get('retry-after'))).toBeGreaterThan(0)
    expect(locked.body.message).toMatch(/try again in \d+ minute/i)
  })

  it('locks a client address that tries many e-mails', async () => {
    const client = new Client()
    let last = 0
    for (let i = 0; i < 31; i++) {
      last = (await client.post('/api/auth/sign-in', { email: `guess${i}@fixture.example`, password: 'guessing-password' })).status
    }
    expect(last).toBe(429)
    // Another address is not affected.
    expect((await new Client().post('/api/auth/sign-in', { email: org.users.admin.email, password: org.users.admin.password })).status).toBe(200)
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
