/**
 * Hostile bodies against every route that reads one.
 *
 * The routes come from the file names under server/api (tests/support/routes.ts), so a route added
 * tomorrow is fuzzed without anyone listing it. Each gets BODIES_PER_ROUTE bodies from fast-check:
 * NUL characters and half surrogate pairs in values and keys, numbers beyond any field's range,
 * wrong types, year-0 and year-9999 dates, very long text, deep nesting, and text that is not JSON
 * at all. Field names are taken from every zod schema in shared/utils, so the bodies reach the
 * fields a route really reads.
 *
 * Two things must hold for every request: the answer is never a 5xx, and a refused request (4xx)
 * leaves everything the organization has saved exactly as it was (a fingerprint of every table
 * with an organization_id column, the audit trail included, is compared after each refusal).
 *
 * A fixed seed keeps a failure reproducible; FUZZ_SEED overrides it. The figures are printed.
 * Routes whose file never reads a body get 5 bodies (to show they ignore them) instead of 100.
 */
import { readdirSync, readFileSync } from 'node:fs'
import { fileURLToPath } from 'node:url'
import fc from 'fast-check'
import { sql } from 'drizzle-orm'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { z } from 'zod'
import { closeTestDb, createOrganization, testDb } from '../support/fixtures'
import type { FixtureOrganization } from '../support/fixtures'
import { Client, RawBody } from '../support/http'
import { createEstate, pathValues } from '../support/estate'
import type { Estate } from '../support/estate'
import { BODY_METHODS, discoverRoutes, fillPath } from '../support/routes'
import type { DiscoveredRoute } from '../support/routes'

const BODIES_PER_ROUTE = Number(process.env.FUZZ_BODIES ?? 100)
const WORKERS = Number(process.env.FUZZ_WORKERS ?? 4)
const SEED = Number(process.env.FUZZ_SEED ?? 20261202)
/** Routes whose callers are not signed in; everything else is fuzzed as the admin, who passes every role gate. */
const ANONYMOUS_ROUTES = /^(POST|PATCH|PUT) \/api\/auth\//

/** Every object key of every zod schema exported from shared/utils/*-schemas.ts. */
async function schemaFieldNames(): Promise<string[]> {
  const dir = fileURLToPath(new URL('../../shared/utils/', import.meta.url))
  const names = new Set<string>()
  const visit = (schema: unknown, depth: number) => {
    if (!(schema instanceof z.ZodType) || depth > 6) return
    const def = (schema as unknown as { def: Record<string, unknown> }).def
    if (def.type === 'object') {
      for (const [key, child] of Object.entries(def.shape as Record<string, unknown>)) {
        names.add(key)
        visit(child, depth + 1)
      }
    }
    for (const inner of [def.innerType, def.in, def.out, def.element, def.valueType]) visit(inner, depth + 1)
    for (const option of (def.options as unknown[] | undefined) ?? []) visit(option, depth + 1)
  }
  for (const file of readdirSync(dir).filter(f => f.endsWith('-schemas.ts'))) {
    const module = await import(/* @vite-ignore */ `${dir}${file}`) as Record<string, unknown>
    for (const value of Object.values(module)) visit(value, 0)
  }
  return [...names].sort()
}

function hostileBodies(fieldNames: string[]) {
  const hostileText = fc.oneof(
    fc.constantFrom('\u0000', 'valve\u0000seat', '\ud800', 'mask \udc00', '\ud83d', '', '   ', '0000-01-01', '9999-12-31', '0000-01-01T00:00:00Z',
      '275760-09-13T00:00:00Z', '2026-02-30', 'NaN', 'Infinity', '-1', '1e308', '1,5', '<img src=x>', '../../etc', '%00'),
    fc.string({ unit: 'binary', maxLength: 40 }),
    fc.string({ maxLength: 6 }).map(s => s.repeat(2000) + 'x'.repeat(3000)),
    fc.uuid()
  )
  const hostileNumber = fc.oneof(
    fc.constantFrom(1e308, -1e308, 5e-324, -0, 0, -1, 2 ** 31, 2 ** 53 + 2, 1e20, -1e20, 0.5, 1e9 + 1),
    fc.double({ noNaN: true, noDefaultInfinity: true }),
    fc.integer()
  )
  const leaf = fc.oneof(hostileText, hostileNumber, fc.boolean(), fc.constant(null))
  const value = fc.letrec(tie => ({
    any: fc.oneof({ depthSize: 'small', withCrossShrink: true }, leaf, leaf, fc.array(tie('any'), { maxLength: 4 }), fc.dictionary(fc.constantFrom(...fieldNames), tie('any'), { maxKeys: 3 }))
  })).any
  const key = fc.oneof(fc.constantFrom(...fieldNames), fc.constantFrom(...fieldNames), fc.constantFrom('na\u0000me', '\ud800', '__proto__', 'constructor'))
  const object = fc.dictionary(key, value, { minKeys: 1, maxKeys: 8 }).map(o => JSON.stringify(o))
  const deep = fc.integer({ min: 40, max: 400 }).map(n => '['.repeat(n) + ']'.repeat(n))
  const notJson = fc.constantFrom('{"version": 1e400}', '{"inside": 1e400, "outside": 1}', '{', '{"a":1,}', 'null', '[]', '"text"', '12', 'true', '\u0000', '{"name":"\\u0000"}', '{"name":"\\ud800"}')
  return fc.oneof({ weight: 6, arbitrary: object }, { weight: 1, arbitrary: value.map(v => JSON.stringify(v) ?? 'null') }, { weight: 1, arbitrary: deep }, { weight: 2, arbitrary: notJson })
}

let fingerprintQuery: ((organizationId: string) => ReturnType<typeof sql>) | undefined

/** A fingerprint of everything the organization has saved: one md5 per table with an organization_id, in one query. */
async function fingerprint(organizationId: string): Promise<string> {
  const db = testDb()
  if (!fingerprintQuery) {
    const tables = await db.execute<{ table_name: string }>(sql`select table_name from information_schema.columns where table_schema = 'public' and column_name = 'organization_id' order by table_name`)
    const names = tables.rows.map(r => r.table_name)
    fingerprintQuery = id => sql`select concat_ws(' ', ${sql.join(names.map(name =>
      sql`(select ${name} || ':' || coalesce(md5(string_agg(t::text, '|' order by t::text)), '-') from ${sql.identifier(name)} t where organization_id = ${id})`), sql`, `)}) as digest`
  }
  const result = await db.execute<{ digest: string }>(fingerprintQuery(organizationId))
  return result.rows[0]!.digest
}

/** A route file that never reads its body: a handful of bodies show it ignores them, a hundred would only send mail. */
function readsBody(route: DiscoveredRoute): boolean {
  return /\b(parseBody|readBody|readValidatedBody|readRawBody|readMultipartFormData|readFormData)\(/.test(readFileSync(route.file, 'utf8'))
}

interface Worker { org: FixtureOrganization, estate: Estate }

let workers: Worker[]
let fields: string[]
beforeAll(async () => {
  // Each worker fuzzes its share of the routes in its own organization, so the fingerprints of
  // one never see another's changes.
  workers = await Promise.all(Array.from({ length: WORKERS }, async () => {
    const org = await createOrganization('Fuzz')
    return { org, estate: await createEstate(org) }
  }))
  fields = await schemaFieldNames()
})
afterAll(closeTestDb)

describe('hostile bodies', () => {
  it('never give a server error, and a refused body changes nothing saved', async () => {
    const routes = discoverRoutes().filter(r => BODY_METHODS.has(r.method))
    expect(routes.length).toBeGreaterThan(20)
    const serverErrors: string[] = []
    const changedByRefusal: string[] = []
    const statusCounts = new Map<number, number>()
    const ignoringBody: string[] = []
    let sent = 0
    const started = Date.now()
    const queue = routes.map((route, index) => ({ route, index }))
    await Promise.all(workers.map(async ({ org, estate }) => {
      const anonymous = new Client()
      let before = await fingerprint(org.id)
      for (let next = queue.shift(); next; next = queue.shift()) {
        const { route, index } = next
        const path = fillPath(route, pathValues(estate, route.key))
        expect(path, `${route.key}: no value for its path parameters; add one to tests/support/estate.ts`).not.toBeNull()
        const client = ANONYMOUS_ROUTES.test(route.key) ? anonymous : estate.admin
        const runs = readsBody(route) ? BODIES_PER_ROUTE : 5
        if (runs < BODIES_PER_ROUTE) ignoringBody.push(route.key)
        for (const body of fc.sample(hostileBodies(fields), { numRuns: runs, seed: SEED + index })) {
          const response = await client.fetch(route.method, path!, new RawBody(body))
          await response.arrayBuffer()
          sent++
          statusCounts.set(response.status, (statusCounts.get(response.status) ?? 0) + 1)
          if (response.status >= 500) serverErrors.push(`${route.key} ${response.status} ← ${body.slice(0, 160)}`)
          const after = await fingerprint(org.id)
          if (response.status >= 400 && response.status < 500 && after !== before) {
            changedByRefusal.push(`${route.key} ${response.status} ← ${body.slice(0, 160)}`)
          }
          before = after
        }
      }
    }))
    const seconds = ((Date.now() - started) / 1000).toFixed(1)
    const summary = [...statusCounts].sort((a, b) => a[0] - b[0]).map(([s, n]) => `${s}×${n}`).join(' ')
    console.log(`[fuzz] ${routes.length} routes (${ignoringBody.length} never read a body: 5 each), ${sent} bodies in ${seconds} s, ${WORKERS} workers, seed ${SEED}: ${summary}; 5xx: ${serverErrors.length}; refusals that changed data: ${changedByRefusal.length}`)
    expect(serverErrors, serverErrors.slice(0, 20).join('\n')).toEqual([])
    expect(changedByRefusal, changedByRefusal.slice(0, 20).join('\n')).toEqual([])
  }, 300_000)
})
