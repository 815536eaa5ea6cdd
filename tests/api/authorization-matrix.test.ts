/**
 * The authorization matrix: every route under server/api × anonymous, each role, and another
 * organization's ids, against the role table of ../shared/DOMAIN.md ("People and roles").
 *
 * HOW TO ADD A ROUTE: add one line to WHO_MAY below, `'METHOD /api/path/:param': 'who'`, where
 * `who` is
 *   'public'                       no sign-in (sign-in, password reset, card verification, health);
 *   'any'                          any signed-in role;
 *   'tester reviewer trainer'      the roles allowed, separated by spaces (admin is always allowed:
 *                                  an admin may do everything in their organization);
 *   'wearer:own'                   that role only for their own records: someone else's → 404.
 * A route without a line fails this test, and so does a line whose route no longer exists.
 * Path parameters are filled from tests/support/estate.ts (one row of each resource).
 *
 * A route with both an `:id` and a body also needs one line in VALID_BODIES: a body its schema
 * accepts, so that the id, not the body, decides the answer to another organization's caller
 * (routes validate the body before they look the id up).
 *
 * What each cell must answer: anonymous → 401 (public routes: anything but a 5xx); a role not
 * allowed → 403; an allowed role → neither 401, 403 nor 5xx (often 400, since the body is empty);
 * an allowed role with another organization's ids → 404, the same as a missing record;
 * 'role:own' with a record of someone else in the same organization → 404.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { ROLES } from '../../shared/utils/roles'
import type { Role } from '../../shared/utils/roles'
import { closeTestDb, createOrganization } from '../support/fixtures'
import type { FixtureOrganization } from '../support/fixtures'
import { Client, signedIn } from '../support/http'
import { createEstate, pathValues } from '../support/estate'
import type { Estate } from '../support/estate'
import { BODY_METHODS, discoverRoutes, fillPath } from '../support/routes'
import type { DiscoveredRoute } from '../support/routes'

const WHO_MAY: Record<string, string> = {
  'GET /api/auth/me': 'any',
  'POST /api/auth/password-reset': 'public',
  'POST /api/auth/sign-in': 'public',
  'POST /api/auth/sign-out': 'public',
  'POST /api/auth/sign-out-everywhere': 'any',
  'GET /api/auth/tokens/:token': 'public',
  'POST /api/auth/tokens/:token': 'public',
  'GET /api/bench-rigs': 'tester reviewer trainer',
  'POST /api/bench-rigs': 'tester',
  'GET /api/bench-rigs/:id': 'tester reviewer trainer',
  'PATCH /api/bench-rigs/:id': 'tester',
  'GET /api/counters': 'tester reviewer trainer',
  'POST /api/counters': 'tester',
  'GET /api/counters/:id': 'tester reviewer trainer',
  'PATCH /api/counters/:id': 'tester',
  'GET /api/due-list': 'tester reviewer trainer',
  'GET /api/exports/due-list.csv': 'tester reviewer',
  'GET /api/exports/fit-tests.csv': 'tester reviewer',
  'GET /api/exposure-assessment-options': 'tester reviewer trainer',
  'GET /api/exposure-assessments': 'tester reviewer trainer',
  'POST /api/exposure-assessments': 'reviewer',
  'GET /api/exposure-assessments/:id': 'tester reviewer trainer',
  'PATCH /api/exposure-assessments/:id': 'reviewer',
  'POST /api/exposure-assessments/:id/assignments': 'reviewer',
  'DELETE /api/exposure-assessments/:id/assignments/:assignmentId': 'reviewer',
  'POST /api/exposure-assessments/:id/revisions': 'reviewer',
  'POST /api/exposure-assessments/:id/sign-off': 'reviewer',
  'GET /api/fit-test-options': 'tester reviewer trainer',
  'GET /api/fit-tests': 'tester reviewer trainer wearer:own',
  'POST /api/fit-tests': 'tester',
  'GET /api/fit-tests/:id': 'tester reviewer trainer wearer:own',
  'PATCH /api/fit-tests/:id': 'tester',
  'GET /api/fit-tests/:id/card': 'tester reviewer trainer wearer:own',
  'POST /api/fit-tests/:id/countersign': 'reviewer',
  'POST /api/fit-tests/:id/discard': 'tester',
  'POST /api/fit-tests/:id/finish': 'tester',
  'POST /api/fit-tests/:id/queries': 'reviewer',
  'POST /api/fit-tests/:id/queries/:queryId/answer': 'tester',
  'POST /api/fit-tests/:id/retest': 'tester',
  'GET /api/fit-tests/:id/review': 'tester reviewer trainer wearer:own',
  'POST /api/fit-tests/:id/revisions': 'tester',
  'GET /api/fit-tests/:id/series': 'tester reviewer trainer wearer:own',
  'POST /api/fit-tests/:id/withdraw': 'tester',
  'GET /api/headform-tests': 'tester reviewer trainer',
  'POST /api/headform-tests': 'tester',
  'GET /api/health': 'public',
  'POST /api/imports/clearances': 'tester',
  'POST /api/imports/history': 'tester',
  'POST /api/imports/people': 'tester',
  'GET /api/insights/coverage': 'tester reviewer',
  'GET /api/insights/drift': 'tester reviewer',
  'GET /api/insights/exercises': 'tester reviewer',
  'GET /api/insights/models': 'tester reviewer',
  'GET /api/insights/options': 'tester reviewer',
  'GET /api/insights/pass-rates': 'tester reviewer',
  'GET /api/insights/people/:id': 'tester reviewer',
  'GET /api/insights/testers': 'tester reviewer',
  'GET /api/mask-types': 'tester reviewer trainer',
  'POST /api/mask-types': 'tester',
  'PATCH /api/mask-types/:id': 'tester',
  'GET /api/mask-units': 'tester reviewer trainer',
  'POST /api/mask-units': 'tester',
  'GET /api/mask-units/:id': 'tester reviewer trainer',
  'PATCH /api/mask-units/:id': 'tester',
  'POST /api/mask-units/:id/state': 'tester',
  'GET /api/me/fit-status': 'wearer',
  'GET /api/me/number-format': 'any',
  'PATCH /api/me/reminders': 'wearer',
  'GET /api/outbox': 'admin',
  'GET /api/overview': 'any',
  'GET /api/overview/equipment': 'tester reviewer trainer',
  'GET /api/pass-levels': 'tester reviewer trainer',
  'PUT /api/pass-levels': 'admin',
  'GET /api/people': 'tester reviewer trainer',
  'POST /api/people': 'tester',
  'GET /api/people/:id': 'tester reviewer trainer',
  'PATCH /api/people/:id': 'tester',
  'POST /api/people/:id/clearances': 'tester',
  'POST /api/people/:id/link': 'admin',
  'POST /api/people/:id/respirators': 'tester',
  'DELETE /api/people/:id/respirators/:modelId': 'tester',
  'POST /api/people/:id/unlink': 'admin',
  'POST /api/practice-people': 'tester trainer',
  'GET /api/practice-sets': 'tester reviewer trainer',
  'POST /api/practice-sets': 'tester trainer',
  'DELETE /api/practice-sets/:id': 'trainer',
  'GET /api/practice-sets/:id': 'tester reviewer trainer',
  'POST /api/practice-tests': 'tester trainer',
  'GET /api/practice-tests/:id': 'tester reviewer trainer',
  'PATCH /api/practice-tests/:id': 'tester trainer',
  'POST /api/practice-tests/:id/finish': 'tester trainer',
  'GET /api/protection-gaps': 'tester reviewer trainer',
  'GET /api/protection-gaps.csv': 'reviewer',
  'GET /api/protocols': 'tester reviewer trainer',
  'POST /api/protocols': 'admin',
  'DELETE /api/protocols/:key': 'admin',
  'GET /api/readiness-checks': 'tester reviewer trainer',
  'POST /api/readiness-checks': 'tester',
  'GET /api/readiness-checks/:id': 'tester reviewer trainer',
  'POST /api/readiness-checks/:id/abandon': 'tester',
  'POST /api/readiness-checks/:id/fail': 'tester',
  'POST /api/readiness-checks/:id/steps': 'tester',
  'GET /api/readiness-templates': 'tester reviewer trainer',
  'POST /api/readiness-templates': 'admin',
  'GET /api/readiness-templates/:id': 'tester reviewer trainer',
  'PATCH /api/readiness-templates/:id': 'admin',
  'POST /api/reminders/preview': 'tester',
  'POST /api/reminders/run': 'admin',
  'POST /api/reminders/send': 'tester',
  'GET /api/respirator-models': 'any',
  'POST /api/respirator-models': 'admin',
  'PATCH /api/respirator-models/:id': 'admin',
  'GET /api/reviews/queue': 'reviewer',
  'GET /api/settings': 'admin',
  'PATCH /api/settings': 'admin',
  'GET /api/settings/oversight': 'admin',
  'PATCH /api/settings/oversight': 'admin',
  'GET /api/users': 'admin',
  'POST /api/users': 'admin',
  'GET /api/users/:id': 'admin',
  'PATCH /api/users/:id': 'admin',
  'POST /api/users/:id/invitation': 'admin',
  'GET /api/verify/:token': 'public'
}

const VALID_BODIES: Record<string, unknown> = {
  'PATCH /api/bench-rigs/:id': { description: 'Matrix probe' },
  'PATCH /api/counters/:id': { description: 'Matrix probe' },
  'PATCH /api/exposure-assessments/:id': { version: 1, title: 'Matrix probe', input: { contaminants: [{ name: 'Probe solvent', form: 'gas-vapour', exposure: { mode: 'single', value: 50, unit: 'ppm' }, limit: { value: 100, unit: 'ppm', kind: 'twa-8h', source: 'invented for the matrix' } }], additiveMixture: false, oxygenDeficient: false } },
  'POST /api/exposure-assessments/:id/assignments': { jobTitle: 'Matrix probe' },
  'POST /api/exposure-assessments/:id/revisions': { reason: 'Matrix probe of tenancy' },
  'POST /api/exposure-assessments/:id/sign-off': {},
  'PATCH /api/fit-tests/:id': { version: 1 },
  'POST /api/fit-tests/:id/countersign': { comment: 'Matrix probe' },
  'POST /api/fit-tests/:id/discard': { reason: 'Matrix probe of tenancy' },
  'POST /api/fit-tests/:id/finish': { version: 1 },
  'POST /api/fit-tests/:id/queries': { question: 'Matrix probe of tenancy?' },
  'POST /api/fit-tests/:id/queries/:queryId/answer': { answer: 'Matrix probe of tenancy' },
  'POST /api/fit-tests/:id/retest': { idempotencyKey: 'matrix-probe-retest' },
  'POST /api/fit-tests/:id/revisions': { reason: 'Matrix probe of tenancy' },
  'POST /api/fit-tests/:id/withdraw': { reason: 'Matrix probe of tenancy' },
  'PATCH /api/mask-types/:id': { headformRetestDays: 365 },
  'PATCH /api/mask-units/:id': { size: 'M' },
  'POST /api/mask-units/:id/state': { state: 'held', reason: 'Matrix probe of tenancy' },
  'PATCH /api/people/:id': { jobTitle: 'Operator' },
  'POST /api/people/:id/clearances': { clearedOn: '2026-01-15', clearedBy: 'Matrix probe clinic (invented)', respiratorClasses: ['elastomeric-half-mask'] },
  'POST /api/people/:id/link': { userId: '00000000-0000-4000-8000-000000000000' },
  'POST /api/people/:id/respirators': { respiratorModelId: '00000000-0000-4000-8000-000000000000' },
  'POST /api/people/:id/unlink': {},
  'PATCH /api/practice-tests/:id': { version: 1 },
  'POST /api/practice-tests/:id/finish': { version: 1 },
  'POST /api/readiness-checks/:id/abandon': { reason: 'Matrix probe of tenancy' },
  'POST /api/readiness-checks/:id/fail': {},
  'POST /api/readiness-checks/:id/steps': { stepIndex: 0, value: true },
  'PATCH /api/readiness-templates/:id': { active: true },
  'PATCH /api/respirator-models/:id': { notes: 'Matrix probe' },
  'PATCH /api/users/:id': { displayName: 'Matrix Wearer' },
  'POST /api/users/:id/invitation': {}
}

type Access = { kind: 'public' } | { kind: 'signed-in', roles: Set<Role> | 'any', ownOnly: Set<Role> }

function readAccess(who: string): Access {
  if (who === 'public') return { kind: 'public' }
  if (who === 'any') return { kind: 'signed-in', roles: 'any', ownOnly: new Set() }
  const roles = new Set<Role>(['admin'])
  const ownOnly = new Set<Role>()
  for (const word of who.split(/\s+/)) {
    const [role, scope] = word.split(':') as [Role, string | undefined]
    if (!ROLES.includes(role)) throw new Error(`'${word}' in WHO_MAY is not a role (${ROLES.join(', ')}).`)
    roles.add(role)
    if (scope === 'own') ownOnly.add(role)
  }
  return { kind: 'signed-in', roles, ownOnly }
}

const routes = discoverRoutes()
let orgA: FixtureOrganization
let orgB: FixtureOrganization
let estateA: Estate
let estateB: Estate
const clients = {} as Record<Role, Client>
beforeAll(async () => {
  [orgA, orgB] = await Promise.all([createOrganization('MatrixA'), createOrganization('MatrixB')])
  ;[estateA, estateB] = await Promise.all([createEstate(orgA), createEstate(orgB)])
  for (const role of ROLES) clients[role] = await signedIn(orgA.users[role].email, orgA.users[role].password)
})
afterAll(closeTestDb)

describe('the authorization matrix', () => {
  it('has exactly one row for every route under server/api', () => {
    const missing = routes.filter(r => !(r.key in WHO_MAY)).map(r => r.key)
    const stale = [...Object.keys(WHO_MAY), ...Object.keys(VALID_BODIES)].filter(key => !routes.some(r => r.key === key))
    const needBody = routes.filter(r => r.params.includes('id') && BODY_METHODS.has(r.method) && WHO_MAY[r.key] !== 'public' && !(r.key in VALID_BODIES)).map(r => r.key)
    expect(needBody, `Add a body the schema accepts to VALID_BODIES in tests/api/authorization-matrix.test.ts for: ${needBody.join(', ')}`).toEqual([])
    expect(missing, `Add a row to WHO_MAY in tests/api/authorization-matrix.test.ts for: ${missing.join(', ')} (who may call it, per DOMAIN.md's role table)`).toEqual([])
    expect(stale, `Remove these rows from WHO_MAY or VALID_BODIES; their routes are gone: ${stale.join(', ')}`).toEqual([])
  })

  it('answers every route, caller and organization as the role table says', async () => {
    const violations: string[] = []
    let cells = 0
    const call = async (client: Client, route: DiscoveredRoute, path: string) => {
      const reply = await client.request(route.method, path, BODY_METHODS.has(route.method) ? VALID_BODIES[route.key] ?? {} : undefined)
      return reply.status
    }
    const check = (label: string, status: number, ok: (s: number) => boolean, expected: string) => {
      cells++
      if (!ok(status)) violations.push(`${label}: ${status}, expected ${expected}`)
    }
    // Signing out ends the caller's session, so those routes go last for every caller: signing out
    // everywhere first (it needs a session), then the plain sign-out (public).
    const last = ['POST /api/auth/sign-out-everywhere', 'POST /api/auth/sign-out']
    const ordered = [...routes].sort((a, b) => last.indexOf(a.key) - last.indexOf(b.key))
    for (const route of ordered) {
      const who = WHO_MAY[route.key]
      if (!who) continue
      const access = readAccess(who)
      const own = fillPath(route, pathValues(estateA, route.key))!
      const other = fillPath(route, pathValues(estateB, route.key))!
      check(`${route.key} anonymous`, await call(new Client(), route, own),
        s => access.kind === 'public' ? s < 500 : s === 401, access.kind === 'public' ? 'no 5xx' : '401')
      for (const role of ROLES) {
        const label = `${route.key} ${role}`
        const status = await call(clients[role], route, own)
        if (access.kind === 'public') {
          check(label, status, s => s < 500, 'no 5xx')
          continue
        }
        const allowed = access.roles === 'any' || access.roles.has(role)
        if (!allowed) {
          check(label, status, s => s === 403, '403')
          continue
        }
        if (access.ownOnly.has(role) && route.params.length) {
          check(`${label} (someone else's record)`, status, s => s === 404, '404')
        } else {
          check(label, status, s => s !== 401 && s !== 403 && s < 500, 'neither 401, 403 nor 5xx')
        }
        if (route.params.length) {
          check(`${label} (another organization's ids)`, await call(clients[role], route, other), s => s === 404, '404')
        }
      }
    }
    console.log(`[authorization matrix] ${routes.length} routes, ${cells} cells, ${violations.length} violations`)
    expect(violations, violations.join('\n')).toEqual([])
  }, 180_000)
})
