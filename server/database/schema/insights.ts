import { sql } from 'drizzle-orm'
import { boolean, date, doublePrecision, index, integer, jsonb, pgTable, primaryKey, text, timestamp, uuid } from 'drizzle-orm/pg-core'
import { fitTests } from './fit-tests'
import { organizations } from './organizations'

// Summary tables for insights, kept by server/database/insight-facts.ts whenever a result is
// finished, corrected or withdrawn, and rebuilt from the raw rows by `rebuildInsightFacts`. The
// raw rows stay the truth: everything here can be thrown away and rebuilt. The ids copied from
// the fit test carry no foreign keys of their own; the fit test's cascade removes the row.

/**
 * One row per current finished fit test with a verdict (status 'finished'): what every panel
 * aggregates. Calibration dates and names are read when a panel runs, and a site's changed time
 * zone is noticed there, so editing a site, a counter or a person never leaves a row stale.
 */
export const insightResults = pgTable('insight_results', {
  fitTestId: uuid().primaryKey().references(() => fitTests.id, { onDelete: 'cascade' }),
  organizationId: uuid().notNull().references(() => organizations.id, { onDelete: 'cascade' }),
  siteId: uuid().notNull(),
  personId: uuid().notNull(),
  testerUserId: uuid().notNull(),
  counterId: uuid(),
  respiratorModelId: uuid().notNull(),
  respiratorMake: text().notNull(),
  respiratorModel: text().notNull(),
  respiratorSize: text().notNull(),
  protocolKey: text().notNull(),
  performedAt: timestamp({ withTimezone: true }).notNull(),
  /**
   * The site's time zone when the row was made, and the test's calendar day there. A panel uses
   * the day only while the site still has that zone; otherwise it works the day out again.
   */
  timeZone: text().notNull(),
  localDay: date({ mode: 'string' }).notNull(),
  passed: boolean().notNull(),
  /** ln(overall fit factor); null when there is none (a qualitative test). */
  lnFitFactor: doublePrecision(),
  overallIsLowerBound: boolean(),
  passLevel: doublePrecision(),
  dueOn: date({ mode: 'string' }),
  /** The person's first current result on this model, over all results (no filter). */
  firstAttempt: boolean().notNull(),
  /** The last readiness check of the same counter that ended at or before the test. */
  lastCheckAt: timestamp({ withTimezone: true }),
  lastCheckPassed: boolean(),
  /** That check's calendar day in `timeZone`. */
  lastCheckLocalDay: date({ mode: 'string' }),
  /** Canonical movement of the limiting exercise (quantitative tests with exercise rows). */
  limitingMovement: text(),
  /**
   * Penetration share of each canonical movement in this test (exercises of one movement added),
   * one column per entry of CANONICAL_MOVEMENTS (shared/utils/compute/movements.ts; the SQL names
   * them through shareColumn in insight-scope.ts); null where the protocol lacks the movement.
   * Plain columns, not an array, so the exercises panel sums them without unpacking a value per row.
   */
  shareNormalBreathing: doublePrecision(),
  shareDeepBreathing: doublePrecision(),
  shareHeadSideToSide: doublePrecision(),
  shareHeadUpAndDown: doublePrecision(),
  shareTalking: doublePrecision(),
  shareGrimace: doublePrecision(),
  shareBending: doublePrecision(),
  shareJogging: doublePrecision(),
  /** Shares of movements outside the canonical list (custom protocols), by movement. */
  otherShares: jsonb().$type<Record<string, number>>()
}, table => [
  index('insight_results_organization_performed_idx').on(table.organizationId, table.performedAt),
  index('insight_results_organization_model_idx').on(table.organizationId, table.respiratorModelId, table.performedAt),
  index('insight_results_person_model_idx').on(table.organizationId, table.personId, table.respiratorModelId, table.performedAt),
  // zonesCurrent: is any row's zone no longer its site's?
  index('insight_results_site_zone_idx').on(table.organizationId, table.siteId, table.timeZone)
])

/**
 * Whose fit is drifting, worked out per person and model over all their current results (three or
 * more): the Theil–Sen fit and the flags. Read when the panel is unfiltered or filtered by model
 * only; any other filter changes the points, so the panel then computes from insight_results.
 */
export const insightDrift = pgTable('insight_drift', {
  organizationId: uuid().notNull().references(() => organizations.id, { onDelete: 'cascade' }),
  personId: uuid().notNull(),
  respiratorModelId: uuid().notNull(),
  latestFitTestId: uuid().notNull().references(() => fitTests.id, { onDelete: 'cascade' }),
  tests: integer().notNull(),
  slopePerYear: doublePrecision().notNull(),
  latestLnFitFactor: doublePrecision().notNull(),
  medianLnFitFactor: doublePrecision().notNull(),
  predictedAtDue: doublePrecision().notNull(),
  nextDueOn: date({ mode: 'string' }).notNull(),
  passLevel: doublePrecision(),
  belowMedian: boolean().notNull(),
  predictsFail: boolean().notNull(),
  series: doublePrecision().array().notNull(),
  dates: text().array().notNull()
}, table => [
  primaryKey({ columns: [table.organizationId, table.personId, table.respiratorModelId] }),
  index('insight_drift_flagged_idx').on(table.organizationId, table.slopePerYear).where(sql`below_median or predicts_fail`)
])
