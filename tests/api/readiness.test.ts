import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { signedIn } from '../support/http'
import type { Client } from '../support/http'
import { closeTestDb, createOrganization } from '../support/fixtures'
import type { FixtureOrganization } from '../support/fixtures'

let a: FixtureOrganization
let b: FixtureOrganization
let admin: Client
let tester: Client
let reviewer: Client
let trainer: Client
let wearer: Client
let otherAdmin: Client
let counterId: string
let rigId: string
let counterTemplate: { id: string, steps: { name: string, rule: { kind: string } }[] }

beforeAll(async () => {
  [a, b] = await Promise.all([createOrganization('Weir'), createOrganization('Fen')])
  ;[admin, tester, reviewer, trainer, wearer, otherAdmin] = await Promise.all([
    signedIn(a.users.admin.email, a.users.admin.password),
    signedIn(a.users.tester.email, a.users.tester.password),
    signedIn(a.users.reviewer.email, a.users.reviewer.password),
    signedIn(a.users.trainer.email, a.users.trainer.password),
    signedIn(a.users.wearer.email, a.users.wearer.password),
    signedIn(b.users.admin.email, b.users.admin.password)
  ])
  const counter = await tester.post('/api/counters', { serialNumber: 'FX-C-1', description: 'Bench counter', sampleFlowCm3PerMin: 350, calibrationDueOn: '2099-01-01' })
  expect(counter.status).toBe(201)
  counterId = counter.body.id
  const rig = await tester.post('/api/bench-rigs', { serialNumber: 'FX-R-1', counterId })
  expect(rig.status).toBe(201)
  rigId = rig.body.id
  const templates = await tester.get('/api/readiness-templates')
  counterTemplate = templates.body.find((t: { scope: string }) => t.scope === 'counter')
})
afterAll(closeTestDb)

/** A value that meets each step's rule. */
function passingValue(rule: { kind: string, min?: number, max?: number }) {
  if (rule.kind === 'pass-fail') return true
  if (rule.kind === 'at-most') return rule.max!
  return rule.min!
}

async function start(client: Client = tester) {
  const reply = await client.post('/api/readiness-checks', { templateId: counterTemplate.id, counterId })
  expect(reply.status).toBe(201)
  return reply.body as { id: string, currentStep: number, steps: { name: string, rule: { kind: string, min?: number, max?: number } }[] }
}

describe('counters and bench rigs', () => {
  it('keeps a serial unique and says so beside the field', async () => {
    const reply = await tester.post('/api/counters', { serialNumber: 'FX-C-1', sampleFlowCm3PerMin: 100 })
    expect(reply.status).toBe(409)
    expect(reply.body.data.fieldErrors.serialNumber).toMatch(/already has this serial/)
  })

  it('refuses an impossible flow with a message that names the unit', async () => {
    const reply = await tester.post('/api/counters', { serialNumber: 'FX-C-2', sampleFlowCm3PerMin: 0 })
    expect(reply.status).toBe(400)
    expect(reply.body.data.fieldErrors.sampleFlowCm3PerMin).toMatch(/cm³\/min/)
  })

  it('edits and retires a counter, keeping it in the full list', async () => {
    const created = await tester.post('/api/counters', { serialNumber: 'FX-C-3', sampleFlowCm3PerMin: 100 })
    const edited = await admin.patch(`/api/counters/${created.body.id}`, { description: 'Older unit' })
    expect(edited.body.description).toBe('Older unit')
    expect((await tester.patch(`/api/counters/${created.body.id}`, { active: false })).body.active).toBe(false)
    const active = await reviewer.get('/api/counters')
    expect(active.body.map((c: { serialNumber: string }) => c.serialNumber)).not.toContain('FX-C-3')
    const all = await reviewer.get('/api/counters?includeRetired=true')
    expect(all.body.map((c: { serialNumber: string }) => c.serialNumber)).toContain('FX-C-3')
  })

  it('pairs a rig only with one of the organization\'s counters', async () => {
    const other = await otherAdmin.post('/api/counters', { serialNumber: 'FEN-1', sampleFlowCm3PerMin: 350 })
    const reply = await tester.post('/api/bench-rigs', { serialNumber: 'FX-R-2', counterId: other.body.id })
    expect(reply.status).toBe(400)
    expect(reply.body.data.fieldErrors.counterId).toBeTruthy()
  })
})

describe('readiness templates', () => {
  it('gives every organization the default templates, one per scope', async () => {
    const reply = await reviewer.get('/api/readiness-templates')
    expect(reply.status).toBe(200)
    expect(reply.body.map((t: { scope: string }) => t.scope).sort()).toEqual(['bench-rig', 'counter'])
    expect(reply.body.every((t: { isDefault: boolean }) => t.isDefault)).toBe(true)
  })

  const step = { name: 'Zero', instruction: 'Fit the filter', rule: { kind: 'at-most', max: 1, unit: 'particles/cm³' } }
  it.each([
    ['an empty template name', { name: '  ', scope: 'counter', steps: [step] }, 'name', /Enter a template name/],
    ['no steps', { name: 'Empty', scope: 'counter', steps: [] }, 'steps', /at least one step/],
    ['an empty step name', { name: 'T', scope: 'counter', steps: [{ ...step, name: '' }] }, 'steps.0.name', /Enter a step name/],
    ['minimum above maximum', { name: 'T', scope: 'counter', steps: [{ ...step, rule: { kind: 'between', min: 5, max: 1 } }] }, 'steps.0.rule.max', /Minimum must not be above the maximum/],
    ['a rule with no kind', { name: 'T', scope: 'counter', steps: [{ ...step, rule: { max: 1 } }] }, 'steps.0.rule.kind', /Choose a rule/],
    ['two steps with the same name', { name: 'T', scope: 'counter', steps: [step, { ...step, name: 'zero ' }] }, 'steps.1.name', /same name as step 1/],
    ['a mask part on a counter template', { name: 'T', scope: 'counter', steps: [{ ...step, requiresPart: 'drinkTube' }] }, 'steps.0.requiresPart', /only a bench-rig step/]
  ])('refuses %s with a message beside the field', async (_label, body, field, message) => {
    const reply = await admin.post('/api/readiness-templates', body)
    expect(reply.status).toBe(400)
    expect(reply.body.data.fieldErrors[field]).toMatch(message)
  })

  it('lets an admin add and edit a template, and refuses a duplicate step in an edit', async () => {
    const created = await admin.post('/api/readiness-templates', { name: 'Short counter check', scope: 'counter', steps: [step] })
    expect(created.status).toBe(201)
    const dup = await admin.patch(`/api/readiness-templates/${created.body.id}`, { steps: [step, step] })
    expect(dup.status).toBe(400)
    const renamed = await admin.patch(`/api/readiness-templates/${created.body.id}`, { name: 'Short check' })
    expect(renamed.body.name).toBe('Short check')
  })

  it('leaves templates to admins', async () => {
    expect((await tester.post('/api/readiness-templates', { name: 'T', scope: 'counter', steps: [step] })).status).toBe(403)
    expect((await tester.patch(`/api/readiness-templates/${counterTemplate.id}`, { name: 'X' })).status).toBe(403)
  })
})

describe('the readiness-check runner', () => {
  it('saves each step on the server, so a fresh load resumes where the check was', async () => {
    const check = await start()
    const first = await tester.post(`/api/readiness-checks/${check.id}/steps`, { stepIndex: 0, value: passingValue(check.steps[0]!.rule) })
    expect(first.status).toBe(200)
    // A "reload": a new client of the same tester reads the check from scratch.
    const again = await signedIn(a.users.tester.email, a.users.tester.password)
    const state = await again.get(`/api/readiness-checks/${check.id}`)
    expect(state.body).toMatchObject({ status: 'in-progress', currentStep: 1 })
    expect(state.body.entries).toHaveLength(1)
    expect(state.body.entries[0]).toMatchObject({ stepIndex: 0, passed: true })
    expect(Date.parse(state.body.entries[0].recordedAt)).not.toBeNaN()
  })

  it('keeps a retried step\'s history, then passes and locks the record (409)', async () => {
    const check = await start()
    const zero = check.steps.findIndex(s => s.rule.kind === 'at-most')
    for (let i = 0; i < check.steps.length; i++) {
      if (i === zero) {
        const failed = await tester.post(`/api/readiness-checks/${check.id}/steps`, { stepIndex: i, value: check.steps[i]!.rule.max! + 4 })
        expect(failed.body.currentStep).toBe(i)
        expect(failed.body.entries.at(-1)).toMatchObject({ passed: false })
        expect(failed.body.entries.at(-1).message).toMatch(/above the maximum/)
      }
      const reply = await tester.post(`/api/readiness-checks/${check.id}/steps`, { stepIndex: i, value: passingValue(check.steps[i]!.rule) })
      expect(reply.status).toBe(200)
    }
    const done = await reviewer.get(`/api/readiness-checks/${check.id}`)
    expect(done.body.status).toBe('passed')
    expect(done.body.completedAt).toBeTruthy()
    expect(done.body.entries.filter((e: { stepIndex: number }) => e.stepIndex === zero)).toHaveLength(2)

    const late = await tester.post(`/api/readiness-checks/${check.id}/steps`, { stepIndex: 0, value: true })
    expect(late.status).toBe(409)
    expect(late.body.message).toMatch(/has ended .* can no longer be changed/)
    expect((await tester.post(`/api/readiness-checks/${check.id}/abandon`, { reason: 'too late' })).status).toBe(409)
  })

  it('refuses a value of the wrong kind and a step out of order', async () => {
    const check = await start()
    const wrong = await tester.post(`/api/readiness-checks/${check.id}/steps`, { stepIndex: 0, value: 3 })
    expect(wrong.status).toBe(400)
    expect(wrong.body.data.fieldErrors.value).toMatch(/pass or fail/)
    expect((await tester.post(`/api/readiness-checks/${check.id}/steps`, { stepIndex: 2, value: 0 })).status).toBe(409)
  })

  it('ends a check as failed only after a failed step', async () => {
    const check = await start()
    expect((await tester.post(`/api/readiness-checks/${check.id}/fail`)).status).toBe(409)
    await tester.post(`/api/readiness-checks/${check.id}/steps`, { stepIndex: 0, value: false })
    const failed = await tester.post(`/api/readiness-checks/${check.id}/fail`)
    expect(failed.body).toMatchObject({ status: 'failed' })
  })

  it('abandons a check with a reason, which then covers nothing and is locked', async () => {
    const check = await start()
    const noReason = await tester.post(`/api/readiness-checks/${check.id}/abandon`, { reason: '' })
    expect(noReason.status).toBe(400)
    expect(noReason.body.data.fieldErrors.reason).toMatch(/why/)
    const abandoned = await tester.post(`/api/readiness-checks/${check.id}/abandon`, { reason: 'Fluid ran out' })
    expect(abandoned.body).toMatchObject({ status: 'abandoned', abandonReason: 'Fluid ran out' })
    expect((await tester.post(`/api/readiness-checks/${check.id}/steps`, { stepIndex: 0, value: true })).status).toBe(409)
  })

  it('checks a bench rig with its paired counter', async () => {
    const templates = await tester.get('/api/readiness-templates')
    const rigTemplate = templates.body.find((t: { scope: string }) => t.scope === 'bench-rig')
    const reply = await tester.post('/api/readiness-checks', { templateId: rigTemplate.id, benchRigId: rigId })
    expect(reply.status).toBe(201)
    expect(reply.body).toMatchObject({ counterId, benchRigId: rigId, benchRigSerial: 'FX-R-1' })
    const noRig = await tester.post('/api/readiness-checks', { templateId: rigTemplate.id, counterId })
    expect(noRig.status).toBe(400)
  })
})

describe('roles', () => {
  it('refuses a wearer everywhere in equipment', async () => {
    const check = await start()
    for (const path of ['/api/counters', '/api/bench-rigs', '/api/readiness-templates', '/api/readiness-checks', `/api/readiness-checks/${check.id}`, `/api/counters/${counterId}`, '/api/overview/equipment']) {
      expect((await wearer.get(path)).status, path).toBe(403)
    }
    expect((await wearer.post('/api/counters', { serialNumber: 'W', sampleFlowCm3PerMin: 1 })).status).toBe(403)
  })

  it('lets reviewers and trainers read but not write', async () => {
    const check = await start()
    for (const client of [reviewer, trainer]) {
      expect((await client.get('/api/counters')).status).toBe(200)
      expect((await client.get(`/api/readiness-checks/${check.id}`)).status).toBe(200)
      expect((await client.post('/api/counters', { serialNumber: 'R', sampleFlowCm3PerMin: 100 })).status).toBe(403)
      expect((await client.patch(`/api/counters/${counterId}`, { description: 'x' })).status).toBe(403)
      expect((await client.post('/api/bench-rigs', { serialNumber: 'R', counterId })).status).toBe(403)
      expect((await client.post('/api/readiness-checks', { templateId: counterTemplate.id, counterId })).status).toBe(403)
      expect((await client.post(`/api/readiness-checks/${check.id}/steps`, { stepIndex: 0, value: true })).status).toBe(403)
      expect((await client.post(`/api/readiness-checks/${check.id}/abandon`, { reason: 'not mine' })).status).toBe(403)
    }
  })
})

describe('organization isolation', () => {
  it('answers 404 for another organization\'s counters, rigs, templates and checks', async () => {
    const check = await start()
    expect((await otherAdmin.get(`/api/counters/${counterId}`)).status).toBe(404)
    expect((await otherAdmin.patch(`/api/counters/${counterId}`, { active: false })).status).toBe(404)
    expect((await otherAdmin.get(`/api/bench-rigs/${rigId}`)).status).toBe(404)
    expect((await otherAdmin.patch(`/api/bench-rigs/${rigId}`, { active: false })).status).toBe(404)
    expect((await otherAdmin.get(`/api/readiness-templates/${counterTemplate.id}`)).status).toBe(404)
    expect((await otherAdmin.get(`/api/readiness-checks/${check.id}`)).status).toBe(404)
    expect((await otherAdmin.post(`/api/readiness-checks/${check.id}/steps`, { stepIndex: 0, value: true })).status).toBe(404)
    expect((await otherAdmin.post(`/api/readiness-checks/${check.id}/abandon`, { reason: 'not ours' })).status).toBe(404)
    expect((await otherAdmin.post('/api/readiness-checks', { templateId: counterTemplate.id, counterId })).status).toBe(404)
    const list = await otherAdmin.get('/api/counters')
    expect(list.body.map((c: { id: string }) => c.id)).not.toContain(counterId)
  })
})
