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
  const draftToDiscard = ok(await admin.post('/api/fit-tests', newTest()), 'draft to discard') as { id: string }
  // Invented fit factors well under the half-mask pass level of 100: a failed record to retest.
  const toFail = ok(await admin.post('/api/fit-tests', newTest(standardEntry([20, 30, 25, 40, 30, 20, 35]))), 'failing test') as { id: string, version: number }
  const failed = ok(await admin.post(`/api/fit-tests/${toFail.id}/finish`, { version: toFail.version }), 'finish failing test') as { id: string }
  ok(await admin.post(`/api/people/${program.personId}/respirators`, { respiratorModelId: program.halfMaskId }), 'respirator assignment')
  const protocolKey = `estate-${tag}`
  ok(await admin.post('/api/protocols', {
    key: protocolKey, name: `Estate protocol ${tag}`, source: 'Invented for the estate', ambientPlan: 'per-exercise',
    exercises: [{ key: 'breathing', name: 'Normal breathing', durationSeconds: 60, counted: true, sampling: { ambientSeconds: 6, purgeSeconds: 4, maskSeconds: 40, closingAmbientSeconds: 6 } }]
  }), 'custom protocol')
  const review = ok(await admin.post(`/api/fit-tests/${finished.id}/queries`, { question: 'Estate query: was the strap tension checked?' }), 'query') as { queries: { id: string }[] }
  // Invented exposure (50 ppm against a 100 ppm limit): hazard ratio 0.5, so any class is adequate.
  const assessment = (title: string) => ({
    title, chosenClassKeys: ['elastomeric-half-mask'], rationale: 'Estate rationale (invented).',
    input: {
      contaminants: [{ name: 'Estate solvent', form: 'gas-vapour', exposure: { mode: 'single', value: 50, unit: 'ppm' }, limit: { value: 100, unit: 'ppm', kind: 'twa-8h', source: 'invented for the estate' } }],
      additiveMixture: false, oxygenDeficient: false
    }
  })
  const draftAssessment = ok(await admin.post('/api/exposure-assessments', assessment(`Estate draft ${tag}`)), 'draft assessment') as { id: string }
  const signedAssessment = ok(await admin.post('/api/exposure-assessments', assessment(`Estate signed ${tag}`)), 'assessment') as { id: string }
  ok(await admin.post(`/api/exposure-assessments/${signedAssessment.id}/sign-off`, {}), 'sign-off')
  const assignment = ok(await admin.post(`/api/exposure-assessments/${draftAssessment.id}/assignments`, { personId: program.personId }), 'assignment') as { id: string }
  const practiceSet = ok(await admin.post('/api/practice-sets', { name: `Estate practice ${tag}` }), 'practice set') as { id: string }
  const setToClear = ok(await admin.post('/api/practice-sets', { name: `Estate practice to clear ${tag}` }), 'practice set to clear') as { id: string }
  const practicePerson = ok(await admin.post('/api/practice-people', { practiceSetId: practiceSet.id, fullName: 'Quill Practiceton' }), 'practice person') as { id: string }
  const practiceTest = ok(await admin.post('/api/practice-tests', {
    idempotencyKey: randomUUID(), practicePersonId: practicePerson.id, respiratorClass: 'elastomeric-half-mask', protocolKey: 'osha-standard', sampleFlowCm3PerMin: 100
  }), 'practice test') as { id: string }
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
      'exposure-assessments': draftAssessment.id,
      'assignmentId': assignment.id,
      'practice-sets': practiceSet.id,
      'practice-tests': practiceTest.id,
      'queryId': review.queries[0]!.id,
      'modelId': program.halfMaskId,
      'key': protocolKey,
      'token': 'x'.repeat(43)
    },
    byRoute: {
      'POST /api/fit-tests/:id/withdraw': { 'fit-tests': finished.id },
      'POST /api/fit-tests/:id/revisions': { 'fit-tests': finished.id },
      'GET /api/fit-tests/:id/card': { 'fit-tests': finished.id },
      'GET /api/fit-tests/:id/review': { 'fit-tests': finished.id },
      'POST /api/fit-tests/:id/countersign': { 'fit-tests': finished.id },
      'POST /api/fit-tests/:id/queries': { 'fit-tests': finished.id },
      'POST /api/fit-tests/:id/queries/:queryId/answer': { 'fit-tests': finished.id },
      'POST /api/exposure-assessments/:id/revisions': { 'exposure-assessments': signedAssessment.id },
      // Clearing a set removes its people and tests, so it gets a set of its own.
      'DELETE /api/practice-sets/:id': { 'practice-sets': setToClear.id },
      'GET /api/insights/people/:id': { insights: program.personId },
      'POST /api/fit-tests/:id/discard': { 'fit-tests': draftToDiscard.id },
      'POST /api/fit-tests/:id/retest': { 'fit-tests': failed.id }
    }
  }
}

/** Values to fill a route's path parameters with, from the estate. */
export function pathValues(estate: Estate, routeKey: string): Record<string, string> {
  return { ...estate.ids, ...estate.byRoute[routeKey] }
}
