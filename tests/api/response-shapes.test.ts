/**
 * What routes send: explicit objects, never a row as read. A key below in any answer means a route
 * spread a database row (or returned `.returning()` as is), so a column nobody meant to publish
 * reached the browser. Every GET route is read as an admin over a full estate, and every answer
 * the estate's own writes got is checked too.
 */
import { randomUUID } from 'node:crypto'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { closeTestDb, createOrganization, createProgram } from '../support/fixtures'
import { Client, signedIn } from '../support/http'
import { createEstate, pathValues } from '../support/estate'
import type { Estate } from '../support/estate'
import { discoverRoutes, fillPath } from '../support/routes'

/** Columns no page needs: the tenant, secrets, and bookkeeping of idempotent writes and imports. */
const NEVER_SENT = ['organizationId', 'passwordHash', 'sessionVersion', 'idempotencyKey', 'importKey']

/**
 * Known answers that still carry one of them, each with why. `GET /api/auth/me` names the caller's
 * own organization by design.
 */
const KNOWN: Record<string, string[]> = {
  'GET /api/auth/me': ['organizationId']
}

function keysIn(value: unknown, found = new Set<string>()): Set<string> {
  if (Array.isArray(value)) value.forEach(v => keysIn(v, found))
  else if (value && typeof value === 'object') {
    for (const [key, v] of Object.entries(value)) {
      found.add(key)
      keysIn(v, found)
    }
  }
  return found
}

const leaked = (body: unknown, allowed: string[] = []) => NEVER_SENT.filter(k => !allowed.includes(k) && keysIn(body).has(k))

const writes: { what: string, body: unknown }[] = []
let estate: Estate

beforeAll(async () => {
  // Every answer a write of the estate gets is kept, so the create and action routes are checked too.
  const request = Client.prototype.request
  Client.prototype.request = async function (this: Client, method: string, path: string, body?: unknown) {
    const reply = await request.call(this, method, path, body)
    if (method !== 'GET' && reply.status < 300) writes.push({ what: `${method} ${path}`, body: reply.body })
    return reply
  } as typeof request
  try {
    estate = await createEstate(await createOrganization('Shapes'))
  } finally {
    Client.prototype.request = request
  }
})
afterAll(closeTestDb)

describe('answers name their fields', () => {
  it('no write of the estate answers with a column no page needs', () => {
    expect(writes.length).toBeGreaterThan(10)
    const found = writes.map(w => ({ what: w.what, keys: leaked(w.body) })).filter(w => w.keys.length)
    expect(found).toEqual([])
  })

  it('no GET route answers with one', async () => {
    const found: { route: string, keys: string[] }[] = []
    for (const route of discoverRoutes().filter(r => r.method === 'GET')) {
      const path = fillPath(route, pathValues(estate, route.key))
      if (!path) continue
      const reply = await estate.admin.get(path)
      const keys = leaked(reply.body, KNOWN[route.key])
      if (keys.length) found.push({ route: route.key, keys })
    }
    expect(found).toEqual([])
  })

  it('creating and changing people, catalogue entries, templates and clearances answers with views', async () => {
    const org = await createOrganization('Shapes writes')
    const program = await createProgram(org)
    const admin = await signedIn(org.users.admin.email, org.users.admin.password)
    const tag = randomUUID().slice(0, 6)
    const person = await admin.post('/api/people', { fullName: 'Orrin Vale', employeeNumber: `SH-${tag}` })
    expect(person.status).toBe(201)
    const [template] = (await admin.get('/api/readiness-templates')).body as { scope: string, steps: unknown[] }[]
    const replies = [
      person,
      await admin.patch(`/api/people/${person.body.id}`, { jobTitle: 'Pump operator' }),
      await admin.post(`/api/people/${person.body.id}/clearances`, { clearedOn: '2026-01-05', clearedBy: 'Occupational health', respiratorClasses: ['elastomeric-half-mask'] }),
      await admin.post('/api/respirator-models', { make: `Shape Works ${tag}`, model: 'SW-1', respiratorClass: 'elastomeric-half-mask', sizes: ['M'] }),
      await admin.patch(`/api/respirator-models/${program.halfMaskId}`, { notes: 'Spare stock in the store room' }),
      await admin.post('/api/readiness-templates', { name: `Shape check ${tag}`, scope: template!.scope, steps: template!.steps })
    ]
    for (const reply of replies) expect(reply.status, JSON.stringify(reply.body)).toBeLessThan(300)
    expect(replies.flatMap(r => leaked(r.body))).toEqual([])
    // The duplicate of an employee number is answered by the one unique-violation mapping, beside the field.
    const again = await admin.post('/api/people', { fullName: 'Orrin Vale again', employeeNumber: `SH-${tag}` })
    expect(again.status).toBe(409)
    expect(again.body.data.fieldErrors.employeeNumber).toMatch(/Another person on the roster has this employee number/)
  })
})
