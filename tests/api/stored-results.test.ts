import { randomUUID } from 'node:crypto'
import { and, eq, isNotNull } from 'drizzle-orm'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import * as schema from '../../server/database/schema'
import { signedIn } from '../support/http'
import type { Client } from '../support/http'
import { closeTestDb, createOrganization, createProgram, testDb } from '../support/fixtures'
import type { FixtureOrganization, FixtureProgram } from '../support/fixtures'
import { STANDARD_PROTOCOL } from '../../shared/utils/compute'
import type { Protocol } from '../../shared/utils/compute'
import { evaluateFitTest } from '../../shared/utils/fit-test-evaluate'
import { allPreTestMet, standardEntry, syntheticSeries } from '../support/fit-test-inputs'

// A finished revision keeps the result computed when it was finished, so reading it never re-parses
// its series. These checks hold that stored result to a fresh recomputation from the raw inputs.
let org: FixtureOrganization
let program: FixtureProgram
let tester: Client
beforeAll(async () => {
  org = await createOrganization('StoredResults')
  program = await createProgram(org, {})
  tester = await signedIn(org.users.tester.email, org.users.tester.password)
})
afterAll(closeTestDb)

async function finish(body: Record<string, unknown>) {
  const created = await tester.post('/api/fit-tests', {
    idempotencyKey: randomUUID(), personId: program.personId, respiratorModelId: program.halfMaskId, respiratorSize: 'M',
    protocolKey: 'osha-standard', counterId: program.counterId, siteId: program.siteId, performedAt: '2026-11-20T15:00:00Z',
    preTest: allPreTestMet, ...body
  })
  expect(created.status, JSON.stringify(created.body)).toBe(201)
  const done = await tester.post(`/api/fit-tests/${created.body.id}/finish`, { version: created.body.version })
  expect(done.status, JSON.stringify(done.body)).toBe(200)
  return done.body
}

/** What recomputing a stored row from its raw inputs gives, as it would travel in JSON. */
function recomputed(row: typeof schema.fitTests.$inferSelect) {
  const evaluation = evaluateFitTest({ protocol: row.protocol as Protocol, entry: row.entry, seriesText: row.seriesText, passLevel: row.passLevel!, sampleFlowCm3PerMin: row.sampleFlowCm3PerMin })
  return JSON.parse(JSON.stringify(evaluation))
}

describe('the result stored when a test is finished', () => {
  it('is what recomputing the raw inputs gives, for a series and for a grid', async () => {
    // Series: every in-mask phase at ambient/250 → each exercise 250 → overall 250 (harmonic mean of equal values, derived).
    const series = await finish({ entry: { mode: 'series' }, seriesText: syntheticSeries(STANDARD_PROTOCOL, 6000, 250) })
    // Grid [1000×6, 10] → 66.04: 29 CFR 1910.134 App. A Part I.C.2(c) harmonic mean (DOMAIN.md check value).
    const grid = await finish({ entry: standardEntry([1000, 1000, 1000, 1000, 1000, 1000, 10]) })
    expect(series.result.overall.value).toBeCloseTo(250, 6)
    expect(grid.result.overall.value).toBeCloseTo(66.04, 2)
    for (const id of [series.id, grid.id]) {
      const [row] = await testDb().select().from(schema.fitTests).where(eq(schema.fitTests.id, id))
      expect(row!.evaluation).not.toBeNull()
      expect(row!.evaluation).toEqual(recomputed(row!))
      // The page reads the stored result.
      const read = await tester.get(`/api/fit-tests/${id}`)
      expect(read.body.result).toEqual(row!.evaluation!.result)
      expect(read.body.seriesText).toBeNull()
    }
  })

  it('matches a fresh recomputation on every finished revision that has one', async () => {
    const rows = await testDb().select().from(schema.fitTests)
      .where(and(eq(schema.fitTests.organizationId, org.id), isNotNull(schema.fitTests.evaluation)))
    expect(rows.length).toBeGreaterThan(0)
    for (const row of rows) expect(row.evaluation, row.id).toEqual(recomputed(row))
  })
})
