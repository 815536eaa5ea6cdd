import { and, asc, eq, gt, isNull, ne, sql } from 'drizzle-orm'
import type { StoredFields } from '#shared/utils/fit-test-evaluate'

const FIELDS = ['passLevel', 'overallFitFactor', 'overallIsLowerBound', 'passed', 'limitingExerciseKey'] as const

function same(a: StoredFields[keyof StoredFields], b: StoredFields[keyof StoredFields]) {
  if (typeof a === 'number' && typeof b === 'number') return Math.abs(a - b) <= 1e-9 * Math.max(1, Math.abs(a))
  return a === b
}

/**
 * Stores the computed result of finished quantitative revisions that lack one (loaded before
 * results were stored, or by a script), so reading them never parses their inputs again. Each is
 * recomputed from its raw inputs against the pass level it was finished with, and stored only
 * when the recomputed verdict, overall fit factor and limiting exercise equal the stored ones; a
 * revision that disagrees is left alone (its page keeps recomputing it) and counted.
 */
export async function backfillStoredEvaluations(batch = 200): Promise<{ stored: number, disagreeing: number }> {
  const t = schema.fitTests
  const db = useDb()
  let stored = 0
  let disagreeing = 0
  let after = '00000000-0000-0000-0000-000000000000'
  for (;;) {
    const found = await db.select({ row: t, timeZone: schema.sites.timeZone, organization: schema.organizations }).from(t)
      .innerJoin(schema.sites, eq(schema.sites.id, t.siteId))
      .innerJoin(schema.organizations, eq(schema.organizations.id, t.organizationId))
      .where(and(gt(t.id, after), ne(t.status, 'draft'), eq(t.kind, 'quantitative'), isNull(t.evaluation)))
      .orderBy(asc(t.id)).limit(batch)
    if (found.length === 0) return { stored, disagreeing }
    after = found.at(-1)!.row.id
    const values: { id: string, evaluation: unknown }[] = []
    for (const { row, timeZone, organization } of found) {
      try {
        const { evaluation, stored: fields } = computeStoredResult(row, organization, timeZone)
        if (evaluation && FIELDS.every(f => same(fields[f], row[f]))) values.push({ id: row.id, evaluation })
        else disagreeing++
      } catch {
        disagreeing++
      }
    }
    if (values.length === 0) continue
    await db.execute(sql`update ${t} set evaluation = v.evaluation
      from jsonb_to_recordset(${JSON.stringify(values)}::jsonb) as v(id uuid, evaluation jsonb)
      where ${t.id} = v.id and ${t.evaluation} is null`)
    stored += values.length
  }
}
