import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { signedIn } from '../support/http'
import type { Client } from '../support/http'
import { closeTestDb, createOrganization } from '../support/fixtures'
import type { FixtureOrganization } from '../support/fixtures'

let a: FixtureOrganization
let b: FixtureOrganization
let adminA: Client
beforeAll(async () => {
  [a, b] = await Promise.all([createOrganization('North'), createOrganization('South')])
  adminA = await signedIn(a.users.admin.email, a.users.admin.password)
})
afterAll(closeTestDb)

describe('one organization cannot reach another', () => {
  it('lists only its own users', async () => {
    const reply = await adminA.get('/api/users')
    expect(reply.status).toBe(200)
    const emails = reply.body.map((u: { email: string }) => u.email)
    expect(emails).toContain(a.users.tester.email)
    expect(emails).not.toContain(b.users.tester.email)
    expect(JSON.stringify(reply.body)).not.toMatch(/passwordHash|scrypt/)
  })

  it('gets 404 reading, changing or inviting another organization\'s user', async () => {
    const target = b.users.tester.id
    expect((await adminA.get(`/api/users/${target}`)).status).toBe(404)
    expect((await adminA.patch(`/api/users/${target}`, { active: false })).status).toBe(404)
    expect((await adminA.post(`/api/users/${target}/invitation`)).status).toBe(404)
    const adminB = await signedIn(b.users.admin.email, b.users.admin.password)
    const still = await adminB.get(`/api/users/${target}`)
    expect(still.body).toMatchObject({ active: true, role: 'tester' })
  })

  it('answers a malformed id with the same 404', async () => {
    expect((await adminA.get('/api/users/not-a-uuid')).status).toBe(404)
  })

  it('shows each admin only their own organization\'s mail in the outbox', async () => {
    const adminB = await signedIn(b.users.admin.email, b.users.admin.password)
    const created = await adminB.post('/api/users', { email: `invitee.${Date.now()}@south.example`, displayName: 'South Invitee', role: 'wearer' })
    expect(created.status).toBe(201)
    const outboxA = await adminA.get('/api/outbox')
    const outboxB = await adminB.get('/api/outbox')
    expect(outboxB.body.some((m: { to: string[] }) => m.to.includes(created.body.email))).toBe(true)
    expect(outboxA.body.some((m: { to: string[] }) => m.to.includes(created.body.email))).toBe(false)
  })
})
