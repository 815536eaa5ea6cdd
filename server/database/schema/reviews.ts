import { relations } from 'drizzle-orm'
import { boolean, doublePrecision, index, pgTable, primaryKey, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core'
import { REVIEW_QUERY_STATUSES } from '../../../shared/utils/enums'
import { id, oneOf, timestamps } from './columns'
import { fitTests } from './fit-tests'
import { organizations } from './organizations'
import { users } from './users'

/**
 * A reviewer's countersign of one fit-test revision. Keyed to the revision, not the record: a
 * correction is a new revision, so it needs a fresh countersign.
 */
export const countersigns = pgTable('countersigns', {
  id: id(),
  organizationId: uuid().notNull().references(() => organizations.id, { onDelete: 'cascade' }),
  fitTestId: uuid().notNull().references(() => fitTests.id, { onDelete: 'cascade' }),
  recordId: uuid().notNull(),
  signedByUserId: uuid().notNull().references(() => users.id, { onDelete: 'restrict' }),
  comment: text(),
  signedAt: timestamp({ withTimezone: true }).notNull().defaultNow()
}, table => [
  uniqueIndex('countersigns_fit_test_unique').on(table.fitTestId),
  index('countersigns_organization_idx').on(table.organizationId)
])

/** A reviewer's question sent back to the tester about one revision, and the tester's answer. */
export const reviewQueries = pgTable('review_queries', {
  id: id(),
  organizationId: uuid().notNull().references(() => organizations.id, { onDelete: 'cascade' }),
  fitTestId: uuid().notNull().references(() => fitTests.id, { onDelete: 'cascade' }),
  recordId: uuid().notNull(),
  raisedByUserId: uuid().notNull().references(() => users.id, { onDelete: 'restrict' }),
  question: text().notNull(),
  status: text({ enum: REVIEW_QUERY_STATUSES }).notNull().default('open'),
  answer: text(),
  answeredByUserId: uuid().references(() => users.id, { onDelete: 'restrict' }),
  answeredAt: timestamp({ withTimezone: true }),
  ...timestamps
}, table => [
  oneOf('review_queries_status_check', table.status, REVIEW_QUERY_STATUSES),
  index('review_queries_fit_test_idx').on(table.fitTestId),
  index('review_queries_organization_status_idx').on(table.organizationId, table.status)
])

/**
 * Per-exercise results of finished quantitative revisions, kept for insights only (which exercise
 * breaks the seal). Written when a revision is finished, from the same recomputation that gives
 * the stored overall; `backfillExerciseResults` fills any revision that lacks them.
 */
export const fitTestExerciseResults = pgTable('fit_test_exercise_results', {
  fitTestId: uuid().notNull().references(() => fitTests.id, { onDelete: 'cascade' }),
  organizationId: uuid().notNull().references(() => organizations.id, { onDelete: 'cascade' }),
  exerciseKey: text().notNull(),
  /** Canonical movement (shared/utils/compute/movements.ts), so protocols count together. */
  movement: text().notNull(),
  fitFactor: doublePrecision().notNull(),
  isLowerBound: boolean().notNull(),
  penetrationShare: doublePrecision().notNull(),
  isLimiting: boolean().notNull()
}, table => [
  primaryKey({ columns: [table.fitTestId, table.exerciseKey] }),
  index('fit_test_exercise_results_organization_idx').on(table.organizationId)
])

export const countersignsRelations = relations(countersigns, ({ one }) => ({
  fitTest: one(fitTests, { fields: [countersigns.fitTestId], references: [fitTests.id] }),
  signedBy: one(users, { fields: [countersigns.signedByUserId], references: [users.id] })
}))

export const reviewQueriesRelations = relations(reviewQueries, ({ one }) => ({
  fitTest: one(fitTests, { fields: [reviewQueries.fitTestId], references: [fitTests.id] })
}))
