import { randomUUID } from 'node:crypto'
import { expect } from 'vitest'
import { createProgram } from './fixtures'
import type { FixtureOrganization } from './fixtures'
import { allPreTestMet, standardEntry } from './fit-test-inputs'
import { signedIn } from './http'
import type { Client } from './http'

/**
 * One row of every kind an organization holds, made through the API as a tester and admin would
 * (invented test data). `ids` names a row by the resource folder its `:id` belongs to;
 * `byRoute` overrides that for actions that need a row in a particular state.
 */
export interface Estate {
  admin: Client
  ids: Record<string, string>
  byRoute: Record<string, Record<string, string>>
}

export async function createEstate(org: FixtureOrganization): Promise<Estate> {
  const program = await createProgram(org)
  const admin = await signedIn(org.users.admin.email, org.users.admin.password)
  const tag = randomUUID().slice(0, 6)
  const ok = <T>(reply: { status: number, body: T }, what: string) => {
    expect(reply.status, `${what}: ${JSON.stringify(reply.body)}`).toBeLessThan(300)
    return reply.body
  }
  const counter = ok(await admin.post('/api/counters', { serialNumber: `EST-C-${tag}`, sampleFlowCm3PerMin: 100 }), 'counter') as { id: string }
  const rig = ok(await admin.post('/api/bench-rigs', { serialNumber: `EST-R-${tag}`, counterId: counter.id }), 'rig') as { id: string }
  const maskType = ok(await admin.post('/api/mask-types', { name: `Estate type ${tag}`, headformRetestDays: 365 }), 'mask type') as { id: string }
  const maskUnit = ok(await admin.post('/api/mask-units', { serialNumber: `EST-U-${tag}`, respiratorModelId: program.fullFacepieceId, maskTypeId: maskType.id, size: 'M' }), 'mask unit') as { id: string }
  const templates = ok(await admin.get('/api/readiness-templates'), 'templates') as { id: string, scope: string }[]
  const counterTemplate = templates.find(t => t.scope === 'counter')!
  const check = ok(await admin.post('/api/readiness-checks', { templateId: counterTemplate.id, counterId: counter.id }), 'readiness check') as { id: string }
  const newTest = (entry?: unknown) => ({
    idempotencyKey: randomUUID(), personId: program.personId, respiratorModelId: program.halfMaskId, respiratorSize: 'M',
    protocolKey: 'osha-standard', counterId: program.counterId, siteId: program.siteId, performedAt: '2026-11-20T15:00:00Z',
    preTest: allPreTestMet, ...(entry ? { entry } : {})
  })
  const draft = ok(await admin.post('/api/fit-tests', newTest()), 'draft') as { id: string }
  const toFinish = ok(await admin.post('/api/fit-tests', newTest(standardEntry([250, 400, 300, 350, 280, 260, 320]))), 'test') as { id: string, version: number }
  const finished = ok(await admin.post(`/api/fit-tests/${toFinish.id}/finish`, { version: toFinish.version }), 'finish') as { id: string }
  return {
    admin,
    ids: {
      'counters': counter.id,
      'bench-rigs': rig.id,
      'mask-types': maskType.id,
      'mask-units': maskUnit.id,
      'readiness-templates': counterTemplate.id,
      'readiness-checks': check.id,
      'respirator-models': program.halfMaskId,
      'people': program.personId,
      'users': org.users.wearer.id,
      'fit-tests': draft.id,
      'token': 'x'.repeat(43)
    },
    byRoute: {
      'POST /api/fit-tests/:id/withdraw': { 'fit-tests': finished.id },
      'POST /api/fit-tests/:id/revisions': { 'fit-tests': finished.id },
      'GET /api/fit-tests/:id/card': { 'fit-tests': finished.id }
    }
  }
}

/** Values to fill a route's path parameters with, from the estate. */
export function pathValues(estate: Estate, routeKey: string): Record<string, string> {
  return { ...estate.ids, ...estate.byRoute[routeKey] }
}
