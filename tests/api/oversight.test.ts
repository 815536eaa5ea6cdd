import { spawn } from 'node:child_process'
import type { ChildProcess } from 'node:child_process'
import { randomUUID } from 'node:crypto'
import { createServer } from 'node:net'
import { join } from 'node:path'
import { and, eq } from 'drizzle-orm'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import * as schema from '../../server/database/schema'
import { nextDueDate } from '../../shared/utils/fit-test-evaluate'
import { Client, signedIn } from '../support/http'
import { closeTestDb, createOrganization, createProgram, testDb } from '../support/fixtures'
import type { FixtureOrganization, FixtureProgram } from '../support/fixtures'
import { allPreTestMet, standardEntry } from '../support/fit-test-inputs'
import { outboxUrl, projectDir } from '../support/env'

let org: FixtureOrganization
let program: FixtureProgram
let tester: Client
let admin: Client

const today = new Date().toISOString().slice(0, 10)
function daysFrom(day: string, days: number) {
  const d = new Date(`${day}T12:00:00Z`)
  d.setUTCDate(d.getUTCDate() + days)
  return d.toISOString().slice(0, 10)
}
/** A test date whose 12-month due date falls `daysUntilDue` days from today — 29 CFR 1910.134(f)(2). */
function testedOnForDueIn(daysUntilDue: number) {
  const due = daysFrom(today, daysUntilDue)
  const [y, m, d] = due.split('-')
  return `${Number(y) - 1}-${m}-${d === '29' && m === '02' ? '28' : d}`
}

beforeAll(async () => {
  org = await createOrganization('Oversight')
  program = await createProgram(org)
  tester = await signedIn(org.users.tester.email, org.users.tester.password)
  admin = await signedIn(org.users.admin.email, org.users.admin.password)
})
afterAll(closeTestDb)

async function addPerson(over: Record<string, unknown> = {}) {
  const reply = await tester.post('/api/people', { fullName: `Invented Person ${randomUUID().slice(0, 4)}`, employeeNumber: `OV-${randomUUID().slice(0, 6)}`, siteId: program.siteId, email: `p.${randomUUID().slice(0, 8)}@fixture.example`, ...over })
  expect(reply.status, JSON.stringify(reply.body)).toBe(201)
  return reply.body as { id: string, email: string, employeeNumber: string }
}

async function finishedTest(personId: string, respiratorModelId: string, size: string, testedOn: string, fitFactors: number[]) {
  const created = await tester.post('/api/fit-tests', {
    idempotencyKey: randomUUID(), personId, respiratorModelId, respiratorSize: size, protocolKey: 'osha-standard',
    counterId: program.counterId, siteId: program.siteId, performedAt: `${testedOn}T15:00:00Z`, preTest: allPreTestMet, entry: standardEntry(fitFactors)
  })
  expect(created.status, JSON.stringify(created.body)).toBe(201)
  const finished = await tester.post(`/api/fit-tests/${created.body.id}/finish`, { version: created.body.version })
  expect(finished.status, JSON.stringify(finished.body)).toBe(200)
  return finished.body
}

// Fit factors: seven counted exercises at 1000 give overall 1000 (passes 100 and 500); one at 10
// among 1000s gives 66.04 — DOMAIN.md, harmonic mean per 29 CFR 1910.134 App. A (from memory).
const passing = [1000, 1000, 1000, 1000, 1000, 1000, 1000]
const failing = [1000, 1000, 1000, 1000, 1000, 1000, 10]

describe('people PATCH changes only the fields sent (issue 8, item 5)', () => {
  it('editing a job title keeps clearance, e-mail, site and notes', async () => {
    const person = await addPerson({ jobTitle: 'Operator', medicalClearanceStatus: 'cleared', medicalClearanceOn: '2026-01-15', notes: 'Prefers size M' })
    const reply = await tester.patch(`/api/people/${person.id}`, { jobTitle: 'Shift lead' })
    expect(reply.status).toBe(200)
    const after = (await tester.get(`/api/people/${person.id}`)).body
    expect(after).toMatchObject({ jobTitle: 'Shift lead', medicalClearanceStatus: 'cleared', medicalClearanceOn: '2026-01-15', notes: 'Prefers size M', email: person.email, siteId: program.siteId, employeeNumber: person.employeeNumber })
  })

  it('an empty body changes nothing and is refused with a sentence, not a server error', async () => {
    const person = await addPerson({ jobTitle: 'Operator' })
    // Every PATCH that names nothing to change is refused the same way (DEVELOPERS.md, "A route").
    const reply = await tester.patch(`/api/people/${person.id}`, {})
    expect(reply.status).toBe(400)
    expect(reply.body.message).toMatch(/Nothing to change/)
    expect((await tester.get(`/api/people/${person.id}`)).body.jobTitle).toBe('Operator')
  })
})

describe('several respirators per person', () => {
  it('lists each respirator with its own due date, and an assigned one never tested', async () => {
    const person = await addPerson()
    await finishedTest(person.id, program.halfMaskId, 'M', '2026-03-10', passing)
    await finishedTest(person.id, program.fullFacepieceId, 'L', testedOnForDueIn(-5), passing)
    const third = await testDb().insert(schema.respiratorModels).values({ organizationId: org.id, make: 'Fixture Safety', model: `FX-1 filtering ${randomUUID().slice(0, 4)}`, respiratorClass: 'filtering-facepiece', sizes: ['One'] }).returning()
    expect((await tester.post(`/api/people/${person.id}/respirators`, { respiratorModelId: third[0]!.id })).status).toBe(201)
    const body = (await tester.get(`/api/people/${person.id}`)).body
    const byModel = Object.fromEntries(body.respirators.map((r: any) => [r.model, [r.status, r.dueOn, r.size]]))
    expect(byModel['FX-2 half mask']).toEqual([expect.stringMatching(/current|due-soon/), nextDueDate('2026-03-10', 12), 'M'])
    expect(byModel['FX-9 full facepiece']).toEqual(['overdue', daysFrom(today, -5), 'L'])
    expect(byModel[third[0]!.model]).toEqual(['never-tested', null, null])
    expect(body.status).toBe('overdue')
  })

  it('offers a retest for a failed result, linked to it, and lets a draft be discarded with a reason', async () => {
    const person = await addPerson()
    const failed = await finishedTest(person.id, program.halfMaskId, 'M', today, failing)
    expect(failed.passed).toBe(false)
    const key = randomUUID()
    const retest = await tester.post(`/api/fit-tests/${failed.id}/retest`, { idempotencyKey: key })
    expect(retest.status, JSON.stringify(retest.body)).toBe(201)
    expect(retest.body).toMatchObject({ status: 'draft', personId: person.id, respiratorModelId: program.halfMaskId, respiratorSize: 'M', protocolKey: 'osha-standard', retestOfRecordId: failed.recordId })
    expect((await tester.post(`/api/fit-tests/${failed.id}/retest`, { idempotencyKey: key })).body.id).toBe(retest.body.id)

    expect((await tester.post(`/api/fit-tests/${retest.body.id}/discard`, { reason: '' })).status).toBe(400)
    const discarded = await tester.post(`/api/fit-tests/${retest.body.id}/discard`, { reason: 'Started for the wrong person' })
    expect(discarded.body).toMatchObject({ status: 'discarded', discardedReason: 'Started for the wrong person' })
    const list = await tester.get(`/api/fit-tests?personId=${person.id}`)
    expect(list.body.rows.map((r: any) => r.id)).not.toContain(retest.body.id)
    const audit = await testDb().select().from(schema.auditEvents).where(and(eq(schema.auditEvents.organizationId, org.id), eq(schema.auditEvents.entityId, retest.body.id), eq(schema.auditEvents.action, 'discarded')))
    expect(audit).toHaveLength(1)
    expect((await tester.post(`/api/fit-tests/${failed.id}/discard`, { reason: 'not a draft' })).status).toBe(409)
  })

  it('refuses a retest of a passing result', async () => {
    const person = await addPerson()
    const passed = await finishedTest(person.id, program.halfMaskId, 'M', today, passing)
    expect((await tester.post(`/api/fit-tests/${passed.id}/retest`, { idempotencyKey: randomUUID() })).status).toBe(409)
  })
})

describe('medical clearance records', () => {
  it('records a clearance without medical detail, and the start of a test checks it per respirator class', async () => {
    const own = await createOrganization('Clearance')
    const ownProgram = await createProgram(own)
    const ownTester = await signedIn(own.users.tester.email, own.users.tester.password)
    const ownAdmin = await signedIn(own.users.admin.email, own.users.admin.password)
    const bad = await ownTester.post(`/api/people/${ownProgram.personId}/clearances`, { clearedOn: '2026-01-10', clearedBy: '', respiratorClasses: [] })
    expect(bad.status).toBe(400)
    expect(Object.keys(bad.body.data.fieldErrors)).toEqual(expect.arrayContaining(['clearedBy', 'respiratorClasses']))
    const saved = await ownTester.post(`/api/people/${ownProgram.personId}/clearances`, { clearedOn: '2026-01-10', validUntil: '2099-01-09', clearedBy: 'Invented Occupational Clinic', respiratorClasses: ['elastomeric-half-mask'], restrictions: 'No work over 8 hours in a full facepiece' })
    expect(saved.status, JSON.stringify(saved.body)).toBe(201)
    expect((await ownAdmin.patch('/api/settings/oversight', { clearanceAtStart: 'require-reason' })).status).toBe(200)

    const start = (modelId: string, extra: Record<string, unknown> = {}) => ownTester.post('/api/fit-tests', { idempotencyKey: randomUUID(), personId: ownProgram.personId, respiratorModelId: modelId, respiratorSize: 'M', protocolKey: 'osha-standard', counterId: ownProgram.counterId, siteId: ownProgram.siteId, ...extra })
    const covered = await start(ownProgram.halfMaskId)
    expect(covered.status).toBe(201)
    expect(covered.body.clearanceAtStart).toMatchObject({ onFile: true, validUntil: '2099-01-09' })
    const uncovered = await start(ownProgram.fullFacepieceId)
    expect(uncovered.status).toBe(400)
    expect(uncovered.body.data.fieldErrors.clearanceReason).toMatch(/without a current clearance/)
    const withReason = await start(ownProgram.fullFacepieceId, { clearanceReason: 'Clinic letter seen, record follows' })
    expect(withReason.status).toBe(201)
    expect(withReason.body.clearanceAtStart).toEqual({ onFile: false, clearanceId: null, validUntil: null, reason: 'Clinic letter seen, record follows' })
    expect((await ownAdmin.patch('/api/settings/oversight', { clearanceAtStart: 'refuse' })).status).toBe(200)
    expect((await start(ownProgram.fullFacepieceId, { clearanceReason: 'anything' })).status).toBe(409)
  })

  it('imports clearances from rows, idempotently, with row-level errors', async () => {
    const person = await addPerson()
    const rows = [
      { employeeNumber: person.employeeNumber, clearedOn: '2026-02-01', validUntil: '2027-02-01', clearedBy: 'Invented Clinic', respiratorClasses: 'elastomeric-half-mask; Elastomeric full facepiece (air-purifying)' },
      { employeeNumber: 'NOBODY-1', clearedOn: '2026-02-01', clearedBy: 'Invented Clinic', respiratorClasses: 'elastomeric-half-mask' },
      { employeeNumber: person.employeeNumber, clearedOn: '2026-02-01', clearedBy: 'Invented Clinic', respiratorClasses: 'space suit' }
    ]
    const first = await tester.post('/api/imports/clearances', { rows })
    expect(first.body.added).toBe(1)
    expect(first.body.errors.map((e: any) => e.row)).toEqual([3, 4])
    const again = await tester.post('/api/imports/clearances', { rows })
    expect(again.body).toMatchObject({ added: 0, alreadyThere: 1 })
  })
})

describe('history import', () => {
  it('adds imported history that counts for the due date, and adds nothing the second time', async () => {
    const person = await addPerson()
    const rows = [
      { employeeNumber: person.employeeNumber, testedOn: '2026-02-28', respirator: 'Fixture Safety FX-2 half mask', size: 'M', result: 'pass', overallFitFactor: '1,250', tester: 'Invented Tester' },
      { employeeNumber: person.employeeNumber, testedOn: '2026-02-28', respirator: 'Nobody Co Z-1', size: 'M', result: 'pass' },
      { employeeNumber: person.employeeNumber, testedOn: '2026-02-28', respirator: 'Fixture Safety FX-2 half mask', size: 'M', result: 'pass', overallFitFactor: '1,5' }
    ]
    const first = await tester.post('/api/imports/history', { rows })
    expect(first.status, JSON.stringify(first.body)).toBe(200)
    expect(first.body.added).toBe(1)
    expect(first.body.errors.map((e: any) => e.row)).toEqual([3, 4])
    // "1,5" is refused as ambiguous in point mode — DOMAIN.md, Typing numbers.
    expect(first.body.errors[1].messages[0]).toMatch(/1,5/)
    expect((await tester.post('/api/imports/history', { rows })).body).toMatchObject({ added: 0, alreadyThere: 1 })
    const entries = await testDb().select().from(schema.fitHistoryEntries).where(eq(schema.fitHistoryEntries.personId, person.id))
    // "1,250" with a point decimal mark is 1250 — DOMAIN.md, Typing numbers.
    expect(entries.map(e => [e.overallFitFactor, e.dueOn])).toEqual([[1250, '2027-02-28']])
    const standing = (await tester.get(`/api/people/${person.id}`)).body.respirators[0]
    expect(standing.lastPass).toMatchObject({ source: 'imported', testedOn: '2026-02-28' })
  })
})

describe('linking wearer accounts', () => {
  it('links a new wearer account to the roster entry with the same e-mail, and the wearer sees both respirators', async () => {
    const email = `linked.${randomUUID().slice(0, 8)}@fixture.example`
    const person = await addPerson({ email })
    await finishedTest(person.id, program.halfMaskId, 'M', today, passing)
    await finishedTest(person.id, program.fullFacepieceId, 'L', today, passing)
    const created = await admin.post('/api/users', { email, displayName: 'Linked Wearer', role: 'wearer' })
    expect(created.status, JSON.stringify(created.body)).toBe(201)
    const [row] = await testDb().select().from(schema.people).where(eq(schema.people.id, person.id))
    expect(row!.userId).toBe(created.body.id)
    // Give the account a password directly so it can sign in (invitation flow is tested elsewhere).
    const [wearerRow] = await testDb().select().from(schema.users).where(eq(schema.users.id, org.users.wearer.id))
    await testDb().update(schema.users).set({ passwordHash: wearerRow!.passwordHash }).where(eq(schema.users.id, created.body.id))
    const wearer = await signedIn(email, org.users.wearer.password)
    const mine = (await wearer.get('/api/me/fit-status')).body
    expect(mine.linked).toBe(true)
    expect(mine.respirators.map((r: any) => `${r.respirator} ${r.size}`).sort()).toEqual(['Fixture Safety FX-2 half mask M', 'Fixture Safety FX-9 full facepiece L'])
    expect(mine.respirators.every((r: any) => r.fitTestId)).toBe(true)
  })

  it('lets only an admin link and unlink, and audits the unlink', async () => {
    const person = await addPerson()
    expect((await tester.post(`/api/people/${person.id}/link`, { userId: org.users.wearer.id })).status).toBe(403)
    const linked = await admin.post(`/api/people/${person.id}/link`, { userId: org.users.wearer.id })
    expect(linked.status, JSON.stringify(linked.body)).toBe(200)
    expect((await admin.post(`/api/people/${person.id}/link`, { userId: org.users.wearer.id })).status).toBe(409)
    expect((await admin.post(`/api/people/${person.id}/unlink`, {})).status).toBe(200)
    const audit = await testDb().select().from(schema.auditEvents).where(and(eq(schema.auditEvents.entityId, person.id), eq(schema.auditEvents.action, 'account-unlinked')))
    expect(audit).toHaveLength(1)
    expect((await admin.post(`/api/people/${person.id}/link`, { userId: org.users.tester.id })).status).toBe(400)
  })
})

describe('roles and organization isolation', () => {
  it('keeps due lists, clearances and reminders inside the organization and its roles', async () => {
    const other = await createOrganization('Elsewhere')
    const otherProgram = await createProgram(other)
    expect((await tester.post(`/api/people/${otherProgram.personId}/clearances`, { clearedOn: '2026-01-10', clearedBy: 'Invented Clinic', respiratorClasses: ['elastomeric-half-mask'] })).status).toBe(404)
    expect((await tester.post('/api/reminders/preview', { personIds: [otherProgram.personId] })).status).toBe(404)
    expect((await tester.post(`/api/people/${otherProgram.personId}/respirators`, { respiratorModelId: program.halfMaskId })).status).toBe(404)
    const due = await tester.get('/api/due-list')
    expect(due.body.rows.map((r: any) => r.personId)).not.toContain(otherProgram.personId)
    const wearer = await signedIn(org.users.wearer.email, org.users.wearer.password)
    expect((await wearer.get('/api/due-list')).status).toBe(403)
    expect((await tester.post('/api/reminders/run', {})).status).toBe(403)
    expect((await new Client().get('/api/due-list')).status).toBe(401)
  })
})

async function mailsTo(to: string) {
  return await (await fetch(`${outboxUrl}/messages?to=${encodeURIComponent(to)}`)).json() as { subject: string, text: string }[]
}

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = createServer()
    server.listen(0, '127.0.0.1', () => {
      const address = server.address()
      server.close(() => typeof address === 'object' && address ? resolve(address.port) : reject(new Error('no port')))
    })
  })
}

describe('reminders', () => {
  let second: ChildProcess | undefined
  let secondUrl = ''
  beforeAll(async () => {
    const env = JSON.parse(process.env.SEALWRIGHT_TEST_APP_ENV ?? '{}') as Record<string, string>
    const port = await freePort()
    second = spawn(process.execPath, [join(projectDir, '.output/server/index.mjs')], {
      cwd: projectDir,
      env: { ...process.env, ...env, PORT: String(port), NITRO_PORT: String(port), NUXT_PUBLIC_BASE_URL: `http://127.0.0.1:${port}` },
      stdio: 'ignore'
    })
    secondUrl = `http://127.0.0.1:${port}`
    const deadline = Date.now() + 60_000
    while (Date.now() < deadline) {
      if (await fetch(`${secondUrl}/api/health`).then(r => r.ok, () => false)) return
      await new Promise(resolve => setTimeout(resolve, 250))
    }
    throw new Error('The second app instance did not start.')
  }, 90_000)
  afterAll(() => {
    second?.kill('SIGTERM')
  })

  it('sends each step once, however many times two app instances run the job on one database', async () => {
    const own = await createOrganization('Reminders')
    const ownProgram = await createProgram(own)
    const ownTester = await signedIn(own.users.tester.email, own.users.tester.password)
    const adminA = await signedIn(own.users.admin.email, own.users.admin.password)
    const addOwn = async (name: string, over: Record<string, unknown> = {}) => (await ownTester.post('/api/people', { fullName: name, employeeNumber: `R-${randomUUID().slice(0, 6)}`, siteId: ownProgram.siteId, email: `r.${randomUUID().slice(0, 8)}@fixture.example`, ...over })).body
    const overdue = await addOwn('Invented Overdue')
    const soon = await addOwn('Invented Soon')
    const optedOut = await addOwn('Invented Quiet', { reminderOptOut: true })
    const optOutSaved = await ownTester.patch(`/api/people/${optedOut.id}`, { reminderOptOut: true })
    expect(optOutSaved.body.reminderOptOut).toBe(true)
    const finish = async (personId: string, testedOn: string) => {
      const created = await ownTester.post('/api/fit-tests', { idempotencyKey: randomUUID(), personId, respiratorModelId: ownProgram.halfMaskId, respiratorSize: 'M', protocolKey: 'osha-standard', counterId: ownProgram.counterId, siteId: ownProgram.siteId, performedAt: `${testedOn}T15:00:00Z`, preTest: allPreTestMet, entry: standardEntry(passing) })
      expect((await ownTester.post(`/api/fit-tests/${created.body.id}/finish`, { version: created.body.version })).status).toBe(200)
    }
    await finish(overdue.id, testedOnForDueIn(-3))
    await finish(soon.id, testedOnForDueIn(10))
    await finish(optedOut.id, testedOnForDueIn(-3))

    // The same sealed session cookie works on both instances: sessions live in the cookie.
    const onB = (path: string) => adminA.post(`${secondUrl}${path}`, {})
    const runs = await Promise.all([adminA.post('/api/reminders/run', {}), onB('/api/reminders/run'), adminA.post('/api/reminders/run', {}), onB('/api/reminders/run')])
    expect(runs.map(r => r.status)).toEqual([200, 200, 200, 200])
    expect(runs.reduce((n, r) => n + r.body.wearerMails, 0)).toBe(2)

    const log = await testDb().select().from(schema.reminderLog).where(and(eq(schema.reminderLog.organizationId, own.id), eq(schema.reminderLog.kind, 'wearer')))
    expect(log.map(l => [l.personId, l.step]).sort()).toEqual([[overdue.id, 'overdue-1'], [soon.id, 'ahead']].sort())
    expect(log.every(l => l.sentAt)).toBe(true)
    expect(await mailsTo(overdue.email)).toHaveLength(1)
    expect(await mailsTo(soon.email)).toHaveLength(1)
    // Opted out: no mail, but still on the due list.
    expect(await mailsTo(optedOut.email)).toHaveLength(0)
    const due = await ownTester.get('/api/due-list')
    expect(due.body.rows.find((r: any) => r.personId === optedOut.id)).toMatchObject({ reminderOptOut: true })
    // One digest per tester for the site, once.
    expect(await mailsTo(own.users.tester.email)).toHaveLength(1)
    expect((await mailsTo(own.users.tester.email))[0]!.text).toMatch(/Invented Overdue[\s\S]*Invented Quiet \(No\. [^)]+\) — no e-mail reminders/)
  })

  it('"remind now" previews, skips the opted-out, sends, and logs who sent it', async () => {
    const person = await addPerson()
    const quiet = await addPerson({ reminderOptOut: true })
    await tester.patch(`/api/people/${quiet.id}`, { reminderOptOut: true })
    await finishedTest(person.id, program.halfMaskId, 'M', testedOnForDueIn(-1), passing)
    await finishedTest(quiet.id, program.halfMaskId, 'M', testedOnForDueIn(-1), passing)
    const preview = await tester.post('/api/reminders/preview', { personIds: [person.id, quiet.id] })
    expect(preview.body.sent).toBe(0)
    const byId = Object.fromEntries(preview.body.results.map((r: any) => [r.personId, r]))
    expect(byId[person.id].message.text).toMatch(/FX-2 half mask, size M: Fit test overdue/)
    expect(byId[quiet.id].skipped).toBe('asked for no e-mail reminders')
    expect(await mailsTo(person.email)).toHaveLength(0)
    const sent = await tester.post('/api/reminders/send', { personIds: [person.id, quiet.id] })
    expect(sent.body.sent).toBe(1)
    expect(await mailsTo(person.email)).toHaveLength(1)
    const reminders = (await tester.get(`/api/people/${person.id}`)).body.reminders
    expect(reminders).toMatchObject([{ trigger: 'manual', step: 'manual', recipient: person.email }])
  })
})
