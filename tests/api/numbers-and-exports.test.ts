import { randomUUID } from 'node:crypto'
import { eq } from 'drizzle-orm'
import Papa from 'papaparse'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import * as schema from '../../server/database/schema'
import { STANDARD_PROTOCOL } from '../../shared/utils/compute'
import { signedIn } from '../support/http'
import type { Client } from '../support/http'
import { closeTestDb, createOrganization, createProgram, testDb } from '../support/fixtures'
import type { FixtureOrganization, FixtureProgram } from '../support/fixtures'
import { allPreTestMet, standardEntry, syntheticSeries } from '../support/fit-test-inputs'

let org: FixtureOrganization
let program: FixtureProgram
let admin: Client
let tester: Client
let reviewer: Client
beforeAll(async () => {
  org = await createOrganization('Numbers')
  program = await createProgram(org)
  ;[admin, tester, reviewer] = await Promise.all([
    signedIn(org.users.admin.email, org.users.admin.password),
    signedIn(org.users.tester.email, org.users.tester.password),
    signedIn(org.users.reviewer.email, org.users.reviewer.password)
  ])
})
afterAll(closeTestDb)

function newTest(overrides: Record<string, unknown> = {}) {
  return {
    idempotencyKey: randomUUID(),
    personId: program.personId,
    respiratorModelId: program.halfMaskId,
    respiratorSize: 'M',
    protocolKey: 'osha-standard',
    counterId: program.counterId,
    siteId: program.siteId,
    performedAt: '2026-11-20T15:00:00Z',
    preTest: allPreTestMet,
    ...overrides
  }
}

async function finishedTest(fitFactors: number[], overrides: Record<string, unknown> = {}) {
  const created = await tester.post('/api/fit-tests', newTest({ entry: standardEntry(fitFactors), ...overrides }))
  const finished = await tester.post(`/api/fit-tests/${created.body.id}/finish`, { version: created.body.version })
  expect(finished.status, JSON.stringify(finished.body)).toBe(200)
  return finished.body
}

async function settingsRow() {
  const [row] = await testDb().select().from(schema.organizations).where(eq(schema.organizations.id, org.id))
  return row!.settings
}

describe('the decimal mark setting', () => {
  it('is point until an admin chooses, and every signed-in role can read it', async () => {
    expect((await admin.get('/api/settings')).body).toMatchObject({ uncoveredResults: 'flag', decimalMark: 'point' })
    for (const role of ['tester', 'reviewer', 'trainer', 'wearer'] as const) {
      const client = await signedIn(org.users[role].email, org.users[role].password)
      expect((await client.get('/api/me/number-format')).body, role).toEqual({ decimalMark: 'point' })
    }
  })

  it('changes only the fields sent', async () => {
    expect((await admin.patch('/api/settings', { uncoveredResults: 'refuse' })).body.uncoveredResults).toBe('refuse')
    const mark = await admin.patch('/api/settings', { decimalMark: 'comma' })
    expect(mark.body).toMatchObject({ decimalMark: 'comma', uncoveredResults: 'refuse' })
    expect(await settingsRow()).toMatchObject({ decimalMark: 'comma', uncoveredResults: 'refuse' })
    const back = await admin.patch('/api/settings', { uncoveredResults: 'flag' })
    expect(back.body).toMatchObject({ decimalMark: 'comma', uncoveredResults: 'flag' })
    expect((await tester.get('/api/me/number-format')).body).toEqual({ decimalMark: 'comma' })
    await admin.patch('/api/settings', { decimalMark: 'point' })
  })

  it('says what to fix beside the field, and refuses other roles', async () => {
    const bad = await admin.patch('/api/settings', { decimalMark: 'dot' })
    expect(bad.status).toBe(400)
    expect(bad.body.data.fieldErrors.decimalMark).toMatch(/point or a comma/)
    const unknown = await admin.patch('/api/settings', { passLevelOverrides: { byFitCategory: { half: 1 } } })
    expect(unknown.status).toBe(400)
    expect(unknown.body.message).toMatch(/not passLevelOverrides/)
    expect((await tester.patch('/api/settings', { decimalMark: 'comma' })).status).toBe(403)
    expect((await settingsRow()).decimalMark).toBe('point')
  })
})

describe('a pasted series is read with the decimal mark kept on the record', () => {
  // ambient 1000 /cm³, in-mask 12.5 /cm³ → FF 80 in every exercise (derived: 1000 / 12.5), overall 80.
  const pointText = syntheticSeries(STANDARD_PROTOCOL, 1000, 80)
  const commaText = pointText.replace(/,/g, ';').replace(/\./g, ',')

  it('reads decimal commas with the comma mark and refuses them, row and column named, with the point', async () => {
    const comma = await tester.post('/api/fit-tests', newTest({ entry: { mode: 'series', decimalMark: 'comma' }, seriesText: commaText }))
    expect(comma.status).toBe(201)
    expect(comma.body.overallFitFactor).toBeCloseTo(80, 9)
    const point = await tester.post('/api/fit-tests', newTest({ entry: { mode: 'series', decimalMark: 'point' }, seriesText: commaText }))
    expect(point.body.overallFitFactor).toBeNull()
    const messages = point.body.seriesIssues.map((i: { message: string }) => i.message)
    expect(messages).toContainEqual(expect.stringMatching(/^Row \d+, column 3 \(concentration\): '12,5' is ambiguous: write 12\.5 or 125\.$/))
  })

  it('recomputes a finished record the same after the organization changes its mark', async () => {
    const created = await tester.post('/api/fit-tests', newTest({ entry: { mode: 'series', decimalMark: 'comma' }, seriesText: commaText }))
    const done = await tester.post(`/api/fit-tests/${created.body.id}/finish`, { version: created.body.version })
    expect(done.body.result.overall.value).toBeCloseTo(80, 9)
    await admin.patch('/api/settings', { decimalMark: 'point' })
    const again = await reviewer.get(`/api/fit-tests/${created.body.id}`)
    expect(again.body.result.overall.value).toBeCloseTo(80, 9)
  })
})

describe('a finished record keeps the pass level it was finished against', () => {
  it('does not change its verdict when the organization raises the level later', async () => {
    // Overall 150 ≥ 100, the US half-mask level — 29 CFR 1910.134(f)(7).
    const done = await finishedTest([150, 150, 150, 150, 150, 150, 150])
    expect(done.result.pass).toBe(true)
    await testDb().update(schema.organizations).set({ settings: { ...(await settingsRow()), passLevelOverrides: { byFitCategory: { half: 200 } } } }).where(eq(schema.organizations.id, org.id))
    const later = await reviewer.get(`/api/fit-tests/${done.id}`)
    expect(later.body).toMatchObject({ passLevel: 100, passed: true, result: { pass: true } })
    const draft = await tester.post('/api/fit-tests', newTest({ entry: standardEntry([150, 150, 150, 150, 150, 150, 150]) }))
    expect(draft.body).toMatchObject({ passLevel: 200, result: { pass: false } })
    const { passLevelOverrides: _dropped, ...rest } = await settingsRow()
    await testDb().update(schema.organizations).set({ settings: rest }).where(eq(schema.organizations.id, org.id))
  })
})

describe('the fit-test CSV', () => {
  function parse(text: string) {
    return Papa.parse<Record<string, string>>(String(text), { header: true, skipEmptyLines: true }).data
  }

  it('neutralises every cell a spreadsheet would run as a formula', async () => {
    const hostile = ['=HYPERLINK("http://attacker.example","x")', '+1+1', '-2+3', '@SUM(A1:A2)', '\t=1', '\r=1']
    const people = await testDb().insert(schema.people).values(hostile.map((fullName, i) => ({ organizationId: org.id, siteId: program.siteId, fullName, employeeNumber: `=E${i}`, medicalClearanceStatus: 'cleared' as const, medicalClearanceOn: '2026-01-15' }))).returning()
    for (const person of people) await finishedTest([200, 200, 200, 200, 200, 200, 200], { personId: person.id })
    const reply = await reviewer.get('/api/exports/fit-tests.csv')
    expect(reply.status).toBe(200)
    const rows = parse(reply.body)
    for (const person of people) {
      const line = rows.find(r => r['person'] === `'${person.fullName}`)
      expect(line, JSON.stringify(person.fullName)).toBeTruthy()
      expect(line!['employee number']).toBe(`'${person.employeeNumber}`)
    }
    for (const row of rows) {
      for (const cell of Object.values(row)) expect(/^[=+\-@\t\r]/.test(cell), JSON.stringify(cell)).toBe(false)
    }
  })

  it('carries every exercise\'s concentrations and fit factor, recomputed from the raw inputs', async () => {
    const person = (await testDb().insert(schema.people).values({ organizationId: org.id, siteId: program.siteId, fullName: 'Exercise Columns', medicalClearanceStatus: 'cleared', medicalClearanceOn: '2026-01-15' }).returning())[0]!
    // [1000×6, 10] → 66.04 — harmonic mean, 29 CFR 1910.134 App. A Part I.C.2(c) (DOMAIN.md check value).
    await finishedTest([1000, 1000, 1000, 1000, 1000, 1000, 10], { personId: person.id })
    const rows = parse((await tester.get(`/api/exports/fit-tests.csv?personId=${person.id}`)).body)
    expect(rows).toHaveLength(1)
    const row = rows[0]!
    expect(row).toMatchObject({ 'overall fit factor': '66.0', 'result': 'fail', 'status': 'finished', 'rule set': 'United States (OSHA), 29 CFR 1910.134(f)(7)' })
    expect(row['exercise 1']).toBe('Normal breathing (start)')
    expect(row['exercise 1 ambient before (/cm³)']).toBe('10000')
    expect(row['exercise 1 in-mask (/cm³)']).toBe('10')
    expect(row['exercise 1 fit factor']).toBe('1000.0')
    expect(row['exercise 6']).toBe('Grimace (not counted)')
    expect(row['exercise 6 fit factor']).toBe('')
    expect(row['exercise 8']).toBe('Normal breathing (end)')
    expect(row['exercise 8 in-mask (/cm³)']).toBe('1000')
    expect(row['exercise 8 fit factor']).toBe('10.0')
  })

  it('never says pass for a withdrawn record', async () => {
    const person = (await testDb().insert(schema.people).values({ organizationId: org.id, siteId: program.siteId, fullName: 'Withdrawn Pass', medicalClearanceStatus: 'cleared', medicalClearanceOn: '2026-01-15' }).returning())[0]!
    const done = await finishedTest([500, 500, 500, 500, 500, 500, 500], { personId: person.id })
    expect(done.passed).toBe(true)
    // Withdrawal is a program decision for a tester or admin; a reviewer recommends it (DEVELOPERS.md).
    expect((await tester.post(`/api/fit-tests/${done.id}/withdraw`, { reason: 'Tested with the wrong counter.' })).status).toBe(200)
    const rows = parse((await reviewer.get(`/api/exports/fit-tests.csv?personId=${person.id}`)).body)
    expect(rows).toHaveLength(1)
    expect(rows[0]).toMatchObject({ 'status': 'withdrawn', 'result': 'withdrawn', 'next due': '' })
    const filtered = parse((await reviewer.get(`/api/exports/fit-tests.csv?personId=${person.id}&result=pass`)).body)
    expect(filtered).toHaveLength(0)
  })
})
