/**
 * Two people (or one double click) changing the same thing at once: exactly one change wins,
 * the other is told so with a 409, nothing answers 500, and the audit trail holds one row per
 * change that took effect.
 */
import { randomUUID } from 'node:crypto'
import { and, eq, inArray } from 'drizzle-orm'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import * as schema from '../../server/database/schema'
import { closeTestDb, createOrganization, createProgram, testDb } from '../support/fixtures'
import type { FixtureOrganization, FixtureProgram } from '../support/fixtures'
import { allPreTestMet, standardEntry } from '../support/fit-test-inputs'
import { signedIn } from '../support/http'
import type { Client } from '../support/http'

let org: FixtureOrganization
let program: FixtureProgram
let tester: Client
let admin: Client
beforeAll(async () => {
  org = await createOrganization('Races')
  program = await createProgram(org)
  ;[tester, admin] = await Promise.all([
    signedIn(org.users.tester.email, org.users.tester.password),
    signedIn(org.users.admin.email, org.users.admin.password)
  ])
})
afterAll(closeTestDb)

async function finishedTest(): Promise<{ id: string, recordId: string }> {
  const created = await tester.post('/api/fit-tests', {
    idempotencyKey: randomUUID(), personId: program.personId, respiratorModelId: program.halfMaskId, respiratorSize: 'M',
    protocolKey: 'osha-standard', counterId: program.counterId, siteId: program.siteId, performedAt: '2026-11-20T15:00:00Z',
    preTest: allPreTestMet, entry: standardEntry([250, 400, 300, 350, 280, 260, 320])
  })
  expect(created.status).toBe(201)
  const finished = await tester.post(`/api/fit-tests/${created.body.id}/finish`, { version: created.body.version })
  expect(finished.status, JSON.stringify(finished.body)).toBe(200)
  return { id: finished.body.id, recordId: finished.body.recordId }
}

async function revisionsOf(recordId: string) {
  const t = schema.fitTests
  return testDb().select().from(t).where(eq(t.recordId, recordId))
}

async function auditOf(entityIds: string[], action: string) {
  const a = schema.auditEvents
  return testDb().select().from(a).where(and(eq(a.organizationId, org.id), inArray(a.entityId, entityIds), eq(a.action, action)))
}

describe('corrections racing each other', () => {
  it('30 pairs of corrections at once: one draft each time, the other 409, never a 500', async () => {
    const tests = await Promise.all(Array.from({ length: 30 }, () => finishedTest()))
    let winners = 0
    for (const { id, recordId } of tests) {
      const replies = await Promise.all([
        tester.post(`/api/fit-tests/${id}/revisions`, { reason: 'Wrong size recorded on the grid.' }),
        admin.post(`/api/fit-tests/${id}/revisions`, { reason: 'Wrong size recorded on the grid.' })
      ])
      const statuses = replies.map(r => r.status).sort()
      expect(statuses, JSON.stringify(replies.map(r => r.body))).toEqual([201, 409])
      const drafts = (await revisionsOf(recordId)).filter(r => r.status === 'draft')
      expect(drafts).toHaveLength(1)
      expect(await auditOf(drafts.map(d => d.id), 'revision-started')).toHaveLength(1)
      winners++
    }
    expect(winners).toBe(30)
  }, 120_000)
})

describe('withdrawals', () => {
  it('two at once: one 200 and one 409, one audit row', async () => {
    for (let i = 0; i < 5; i++) {
      const { id } = await finishedTest()
      const replies = await Promise.all([
        tester.post(`/api/fit-tests/${id}/withdraw`, { reason: 'Counter was past its calibration date.' }),
        admin.post(`/api/fit-tests/${id}/withdraw`, { reason: 'Counter was past its calibration date.' })
      ])
      expect(replies.map(r => r.status).sort()).toEqual([200, 409])
      expect(replies.find(r => r.status === 409)!.body.message).toMatch(/already been withdrawn/)
      expect(await auditOf([id], 'withdrawn')).toHaveLength(1)
    }
  })

  it('racing a correction: whatever wins, every 200 took effect and was audited once, and a withdrawn record stays withdrawn', async () => {
    for (let i = 0; i < 10; i++) {
      const { id, recordId } = await finishedTest()
      const [withdrawal, correction] = await Promise.all([
        admin.post(`/api/fit-tests/${id}/withdraw`, { reason: 'Wearer had a beard on the day.' }),
        tester.post(`/api/fit-tests/${id}/revisions`, { reason: 'Exercise order was entered wrongly.' })
      ])
      expect([withdrawal.status, correction.status]).not.toContain(500)
      const revisions = await revisionsOf(recordId)
      const original = revisions.find(r => r.id === id)!
      // The withdrawal always finds the finished revision (a correction leaves it finished), so it wins.
      expect(withdrawal.status).toBe(200)
      expect(original.status).toBe('withdrawn')
      expect(await auditOf([id], 'withdrawn')).toHaveLength(1)
      if (correction.status === 201) {
        expect(await auditOf([correction.body.id], 'revision-started')).toHaveLength(1)
        // Finishing that correction must not reinstate the withdrawn record.
        const finish = await tester.post(`/api/fit-tests/${correction.body.id}/finish`, { version: correction.body.version })
        expect(finish.status).toBe(409)
        expect(finish.body.message).toMatch(/withdrawn/)
        expect((await revisionsOf(recordId)).find(r => r.id === id)!.status).toBe('withdrawn')
      } else {
        expect(correction.status).toBe(409)
        expect(correction.body.message).toMatch(/withdrawn/)
        expect(revisions.filter(r => r.status === 'draft')).toHaveLength(0)
      }
    }
  })
})

describe('finishing', () => {
  it('the same draft finished twice at once: one 200, one 409, one audit row', async () => {
    const created = await tester.post('/api/fit-tests', {
      idempotencyKey: randomUUID(), personId: program.personId, respiratorModelId: program.halfMaskId, respiratorSize: 'M',
      protocolKey: 'osha-standard', counterId: program.counterId, siteId: program.siteId, performedAt: '2026-11-20T15:00:00Z',
      preTest: allPreTestMet, entry: standardEntry([250, 400, 300, 350, 280, 260, 320])
    })
    const replies = await Promise.all([
      tester.post(`/api/fit-tests/${created.body.id}/finish`, { version: created.body.version }),
      admin.post(`/api/fit-tests/${created.body.id}/finish`, { version: created.body.version })
    ])
    expect(replies.map(r => r.status).sort()).toEqual([200, 409])
    expect(await auditOf([created.body.id], 'finished')).toHaveLength(1)
  })
})

describe('readiness checks', () => {
  it('the same step recorded twice at once counts once; abandon and fail at once end the check once', async () => {
    const counter = await admin.post('/api/counters', { serialNumber: `RACE-${randomUUID().slice(0, 6)}`, sampleFlowCm3PerMin: 100 })
    const templates = await admin.get('/api/readiness-templates')
    const template = templates.body.find((t: { scope: string }) => t.scope === 'counter')
    const check = await tester.post('/api/readiness-checks', { templateId: template.id, counterId: counter.body.id })
    expect(check.status).toBe(201)
    const step = template.steps[0]
    const passing = step.rule.kind === 'pass-fail' ? true : step.rule.kind === 'at-most' ? step.rule.max : step.rule.min
    const steps = await Promise.all([
      tester.post(`/api/readiness-checks/${check.body.id}/steps`, { stepIndex: 0, value: passing }),
      admin.post(`/api/readiness-checks/${check.body.id}/steps`, { stepIndex: 0, value: passing })
    ])
    expect(steps.map(r => r.status).sort()).toEqual([200, 409])
    const ends = await Promise.all([
      tester.post(`/api/readiness-checks/${check.body.id}/abandon`, { reason: 'Counter battery flat.' }),
      admin.post(`/api/readiness-checks/${check.body.id}/abandon`, { reason: 'Counter battery flat.' })
    ])
    expect(ends.map(r => r.status).sort()).toEqual([200, 409])
    expect(await auditOf([check.body.id], 'abandoned')).toHaveLength(1)
  })
})
