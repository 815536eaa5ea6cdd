import { inArray, sql } from 'drizzle-orm'
import { exerciseInsightRows } from '#shared/utils/insight-rows'
import type { FitTestResult } from '#shared/utils/compute'
import { evaluateFitTest } from '#shared/utils/fit-test-evaluate'
import type { InsightFilters } from '#shared/utils/insight-schemas'
import { refreshInsightFacts } from '../database/insight-facts'
import * as queries from '../database/insight-queries'
import { insightRead, insightScope as rawScope } from '../database/insight-scope'

export const insightScope = rawScope

/**
 * Keeps the insights summary in step with a record after it was finished, corrected or withdrawn:
 * one call inside the writing transaction, after the status and exercise rows are written.
 */
export const refreshInsights = (tx: Tx, organizationId: string, recordId: string) => refreshInsightFacts(tx, organizationId, [recordId])

export const passRatesByPeriod = (organizationId: string, f: InsightFilters) => insightRead(useDb(), db => queries.passRatesByPeriod(db, organizationId, f))
export const modelSummaries = (organizationId: string, f: InsightFilters) => insightRead(useDb(), db => queries.modelSummaries(db, organizationId, f))
export const exerciseSummaries = (organizationId: string, f: InsightFilters) => insightRead(useDb(), db => queries.exerciseSummaries(db, organizationId, f))
export const driftingPeople = (organizationId: string, f: InsightFilters) => insightRead(useDb(), db => queries.driftingPeople(db, organizationId, f))
export const testerSummaries = (organizationId: string, f: InsightFilters) => insightRead(useDb(), db => queries.testerSummaries(db, organizationId, f))
export const coverageSummaries = (organizationId: string, f: InsightFilters) => insightRead(useDb(), db => queries.coverageSummaries(db, organizationId, f))

async function rows<T>(query: ReturnType<typeof sql>): Promise<T[]> {
  return (await useDb().execute(query)).rows as T[]
}

/** Writes the exercise rows of a just-finished revision, inside the finishing transaction. */
export async function recordExerciseResults(tx: Tx | Database, organizationId: string, fitTestId: string, result: FitTestResult | null | undefined) {
  if (!result) return
  const values = exerciseInsightRows(organizationId, fitTestId, result)
  if (values.length > 0) await tx.insert(schema.fitTestExerciseResults).values(values).onConflictDoNothing()
}

/**
 * Fills exercise rows for finished quantitative revisions that lack them (results loaded by the
 * demo seed or an import), recomputing each from its raw inputs. Returns how many it filled.
 */
export async function backfillExerciseResults(organizationId?: string, batch = 500): Promise<number> {
  let filled = 0
  const org = organizationId ? sql`and ft.organization_id = ${organizationId}` : sql``
  for (;;) {
    const missing = await rows<{ id: string }>(sql`
      select ft.id from fit_tests ft
      where ft.status in ('finished', 'superseded') and ft.kind = 'quantitative' and ft.overall_fit_factor is not null ${org}
        and not exists (select 1 from fit_test_exercise_results e where e.fit_test_id = ft.id)
      limit ${batch}`)
    if (missing.length === 0) return filled
    const t = schema.fitTests
    const full = await useDb().select().from(t).where(inArray(t.id, missing.map(m => m.id)))
    const values = full.flatMap((row) => {
      if (!row.protocol || row.passLevel === null) return []
      const { result } = evaluateFitTest({ protocol: row.protocol, entry: row.entry, seriesText: row.seriesText, passLevel: row.passLevel, sampleFlowCm3PerMin: row.sampleFlowCm3PerMin })
      return exerciseInsightRows(row.organizationId, row.id, result)
    })
    if (values.length === 0) return filled
    await useDb().insert(schema.fitTestExerciseResults).values(values).onConflictDoNothing()
    filled += new Set(values.map(v => v.fitTestId)).size
  }
}
