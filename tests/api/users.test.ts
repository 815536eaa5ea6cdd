import { and, eq } from 'drizzle-orm'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import * as schema from '../../server/database/schema'
import { Client, signedIn } from '../support/http'
import { closeTestDb, createOrganization, testDb } from '../support/fixtures'
import type { FixtureOrganization } from '../support/fixtures'
import { latestMailTo, linkTokenOf } from '../support/outbox'

let org: FixtureOrganization
let admin: Client
beforeAll(async () => {
  org = await createOrganization('Users')
  admin = await signedIn(org.users.admin.email, org.users.admin.password)
})
afterAll(closeTestDb)

describe('the users list', () => {
  it('searches by name or e-mail and sorts', async () => {
    const byEmail = await admin.get(`/api/users?q=${encodeURIComponent(org.users.reviewer.email.slice(0, 12))}`)
    expect(byEmail.body.map((u: { email: string }) => u.email)).toEqual([org.users.reviewer.email])
    const sorted = await admin.get('/api/users?sort=role&dir=desc')
    const roles = sorted.body.map((u: { role: string }) => u.role)
    expect(roles[0]).toBe('wearer')
    const bad = await admin.get('/api/users?sort=password')
    expect(bad.status).toBe(400)
    expect(bad.body.message).toMatch(/sort by one of/i)
  })
})

describe('creating a user', () => {
  it('says what to fix for each bad field', async () => {
    const reply = await admin.post('/api/users', { email: 'nope', displayName: '  ', role: 'boss' })
    expect(reply.status).toBe(400)
    expect(Object.keys(reply.body.data.fieldErrors).sort()).toEqual(['displayName', 'email', 'role'])
  })

  it('refuses an e-mail that already has an account', async () => {
    const reply = await admin.post('/api/users', { email: org.users.tester.email, displayName: 'Twin', role: 'tester' })
    expect(reply.status).toBe(409)
    expect(reply.body.data.fieldErrors.email).toMatch(/already has an account/)
  })

  it('invites by e-mail; the link sets a password once, signs in, and is audited', async () => {
    const email = `new.tester.${Date.now()}@fixture.example`
    const created = await admin.post('/api/users', { email, displayName: 'New Tester', role: 'tester' })
    expect(created.status).toBe(201)
    expect(created.body).toMatchObject({ email, role: 'tester', hasPassword: false })

    const mail = await latestMailTo(email)
    expect(mail.subject).toContain(org.name)
    const token = linkTokenOf(mail)

    const visitor = new Client()
    expect((await visitor.get(`/api/auth/tokens/${token}`)).body).toMatchObject({ purpose: 'invitation', email })
    const tooShort = await visitor.post(`/api/auth/tokens/${token}`, { password: 'short', confirm: 'short' })
    expect(tooShort.status).toBe(400)
    expect(tooShort.body.data.fieldErrors.password).toMatch(/at least 10/)
    const mismatch = await visitor.post(`/api/auth/tokens/${token}`, { password: 'a-good-password', confirm: 'another-one!' })
    expect(mismatch.body.data.fieldErrors.confirm).toMatch(/differ/)

    expect((await visitor.post(`/api/auth/tokens/${token}`, { password: 'a-good-password', confirm: 'a-good-password' })).status).toBe(200)
    expect((await visitor.get('/api/auth/me')).body.email).toBe(email)
    // Single use.
    expect((await new Client().post(`/api/auth/tokens/${token}`, { password: 'b-good-password', confirm: 'b-good-password' })).status).toBe(404)
    expect((await new Client().post('/api/auth/sign-in', { email, password: 'a-good-password' })).status).toBe(200)

    const trail = await testDb().select().from(schema.auditEvents)
      .where(and(eq(schema.auditEvents.organizationId, org.id), eq(schema.auditEvents.entityId, created.body.id)))
    expect(trail.map(e => e.action).sort()).toEqual(['created', 'invitation-accepted'])
  })
})

describe('password reset', () => {
  it('mails a one-hour single-use link and answers the same for unknown addresses', async () => {
    const local = await createOrganization('Reset')
    const user = local.users.reviewer
    const known = await new Client().post('/api/auth/password-reset', { email: user.email })
    const unknown = await new Client().post('/api/auth/password-reset', { email: 'nobody.here@fixture.example' })
    expect(known.status).toBe(200)
    expect(unknown.body).toEqual(known.body)

    const token = linkTokenOf(await latestMailTo(user.email))
    const visitor = new Client()
    expect((await visitor.post(`/api/auth/tokens/${token}`, { password: 'fresh-password-9', confirm: 'fresh-password-9' })).status).toBe(200)
    expect((await new Client().post('/api/auth/sign-in', { email: user.email, password: user.password })).status).toBe(401)
    expect((await new Client().post('/api/auth/sign-in', { email: user.email, password: 'fresh-password-9' })).status).toBe(200)
  })
})

describe('changing users', () => {
  it('changes a role and records before and after in the audit trail', async () => {
    const reply = await admin.patch(`/api/users/${org.users.trainer.id}`, { role: 'reviewer' })
    expect(reply.status).toBe(200)
    expect(reply.body.role).toBe('reviewer')
    const [event] = await testDb().select().from(schema.auditEvents)
      .where(and(eq(schema.auditEvents.entityId, org.users.trainer.id), eq(schema.auditEvents.action, 'updated')))
    expect(event).toMatchObject({ actorUserId: org.users.admin.id, before: expect.objectContaining({ role: 'trainer' }), after: { role: 'reviewer' } })
  })

  it('never lets an admin deactivate or demote themselves', async () => {
    const deactivate = await admin.patch(`/api/users/${org.users.admin.id}`, { active: false })
    expect(deactivate.status).toBe(409)
    expect(deactivate.body.message).toMatch(/your own/i)
    expect((await admin.patch(`/api/users/${org.users.admin.id}`, { role: 'tester' })).status).toBe(409)
  })

  it('always leaves at least one active admin', async () => {
    const local = await createOrganization('LastAdmin')
    const first = await signedIn(local.users.admin.email, local.users.admin.password)
    // Make a second admin, who then tries to demote the first, leaving only themself: allowed.
    expect((await first.patch(`/api/users/${local.users.tester.id}`, { role: 'admin' })).status).toBe(200)
    const second = await signedIn(local.users.tester.email, local.users.tester.password)
    expect((await second.patch(`/api/users/${local.users.admin.id}`, { role: 'reviewer' })).status).toBe(200)
    // Now `second` is the only admin; the demoted first admin cannot act, and second cannot remove themself.
    expect((await first.get('/api/users')).status).toBe(403)
    expect((await second.patch(`/api/users/${local.users.tester.id}`, { active: false })).status).toBe(409)
  })

  it('keeps the audit trail append-only', async () => {
    await expect(testDb().update(schema.auditEvents).set({ action: 'rewritten' }).where(eq(schema.auditEvents.organizationId, org.id)))
      .rejects.toThrow()
  })
})
