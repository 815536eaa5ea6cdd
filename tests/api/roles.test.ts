import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { Client, signedIn } from '../support/http'
import { closeTestDb, createOrganization } from '../support/fixtures'
import type { FixtureOrganization } from '../support/fixtures'

let org: FixtureOrganization
beforeAll(async () => {
  org = await createOrganization('Roles')
})
afterAll(closeTestDb)

const adminRoutes = (targetId: string) => [
  ['GET', '/api/users', undefined],
  ['POST', '/api/users', { email: 'someone.new@fixture.example', displayName: 'Someone New', role: 'tester' }],
  ['GET', `/api/users/${targetId}`, undefined],
  ['PATCH', `/api/users/${targetId}`, { role: 'admin' }],
  ['POST', `/api/users/${targetId}/invitation`, {}],
  ['GET', '/api/outbox', undefined]
] as const

describe('admin routes', () => {
  it.each(['tester', 'reviewer', 'trainer', 'wearer'] as const)('refuse the %s role with 403', async (role) => {
    const client = await signedIn(org.users[role].email, org.users[role].password)
    for (const [method, path, body] of adminRoutes(org.users.wearer.id)) {
      const reply = await client.request(method, path, body)
      expect(reply.status, `${method} ${path}`).toBe(403)
    }
  })

  it('refuse anonymous callers with 401', async () => {
    const client = new Client()
    for (const [method, path, body] of adminRoutes(org.users.wearer.id)) {
      expect((await client.request(method, path, body)).status, `${method} ${path}`).toBe(401)
    }
  })

  it('let the admin in', async () => {
    const client = await signedIn(org.users.admin.email, org.users.admin.password)
    expect((await client.get('/api/users')).status).toBe(200)
  })
})

describe('the overview', () => {
  it.each(['admin', 'tester', 'reviewer', 'trainer', 'wearer'] as const)('opens for the %s role with the organization and role', async (role) => {
    const client = await signedIn(org.users[role].email, org.users[role].password)
    const reply = await client.get('/api/overview')
    expect(reply.status).toBe(200)
    expect(reply.body.organization.name).toBe(org.name)
    expect(reply.body.you.role).toBe(role)
    expect(reply.body.sites).toHaveLength(1)
  })
})

describe('a role change', () => {
  it('takes effect on the next request, whatever the cookie says', async () => {
    const local = await createOrganization('Demote')
    const admin = await signedIn(local.users.admin.email, local.users.admin.password)
    const promoted = await signedIn(local.users.tester.email, local.users.tester.password)
    expect((await promoted.get('/api/users')).status).toBe(403)
    expect((await admin.patch(`/api/users/${local.users.tester.id}`, { role: 'admin' })).status).toBe(200)
    expect((await promoted.get('/api/users')).status).toBe(200)
    expect((await admin.patch(`/api/users/${local.users.tester.id}`, { role: 'tester' })).status).toBe(200)
    expect((await promoted.get('/api/users')).status).toBe(403)
  })
})
