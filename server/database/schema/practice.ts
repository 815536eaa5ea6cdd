import { relations } from 'drizzle-orm'
import { boolean, doublePrecision, index, integer, jsonb, pgTable, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core'
import type { FitTestEntry } from '../../../shared/utils/fit-test-schemas'
import type { Protocol } from '../../../shared/utils/compute'
import { PRACTICE_TEST_STATUSES } from '../../../shared/utils/enums'
import { id, oneOf, timestamps } from './columns'
import { organizations } from './organizations'
import { users } from './users'

/**
 * Practice lives in its own tables, never in `people` or `fit_tests`, so no program list, export,
 * insight, due date, reminder or fit card can ever reach it. A set is a class's practice; a
 * trainer clears a whole set at once (the audit trail keeps what was cleared).
 */
export const practiceSets = pgTable('practice_sets', {
  id: id(),
  organizationId: uuid().notNull().references(() => organizations.id, { onDelete: 'cascade' }),
  name: text().notNull(),
  createdByUserId: uuid().notNull().references(() => users.id, { onDelete: 'restrict' }),
  ...timestamps
}, table => [
  index('practice_sets_organization_idx').on(table.organizationId)
])

/** An invented person a trainee practises on. Never a wearer of the program. */
export const practicePeople = pgTable('practice_people', {
  id: id(),
  organizationId: uuid().notNull().references(() => organizations.id, { onDelete: 'cascade' }),
  practiceSetId: uuid().notNull().references(() => practiceSets.id, { onDelete: 'cascade' }),
  fullName: text().notNull(),
  ...timestamps
}, table => [
  index('practice_people_set_idx').on(table.practiceSetId)
])

/** A trainee's practice fit test: the same raw inputs as a real one, recomputed the same way. */
export const practiceTests = pgTable('practice_tests', {
  id: id(),
  organizationId: uuid().notNull().references(() => organizations.id, { onDelete: 'cascade' }),
  practiceSetId: uuid().notNull().references(() => practiceSets.id, { onDelete: 'cascade' }),
  practicePersonId: uuid().notNull().references(() => practicePeople.id, { onDelete: 'cascade' }),
  traineeUserId: uuid().notNull().references(() => users.id, { onDelete: 'restrict' }),
  idempotencyKey: text(),
  status: text({ enum: PRACTICE_TEST_STATUSES }).notNull().default('draft'),
  version: integer().notNull().default(1),
  respiratorClass: text().notNull(),
  protocolKey: text().notNull(),
  protocol: jsonb().$type<Protocol>().notNull(),
  sampleFlowCm3PerMin: doublePrecision(),
  entry: jsonb().$type<FitTestEntry>().notNull(),
  seriesText: text(),
  passLevel: doublePrecision().notNull(),
  overallFitFactor: doublePrecision(),
  overallIsLowerBound: boolean(),
  passed: boolean(),
  finishedAt: timestamp({ withTimezone: true }),
  ...timestamps
}, table => [
  oneOf('practice_tests_status_check', table.status, PRACTICE_TEST_STATUSES),
  index('practice_tests_set_idx').on(table.practiceSetId),
  uniqueIndex('practice_tests_idempotency_unique').on(table.organizationId, table.idempotencyKey)
])

export const practicePeopleRelations = relations(practicePeople, ({ one }) => ({
  set: one(practiceSets, { fields: [practicePeople.practiceSetId], references: [practiceSets.id] })
}))

export const practiceTestsRelations = relations(practiceTests, ({ one }) => ({
  set: one(practiceSets, { fields: [practiceTests.practiceSetId], references: [practiceSets.id] }),
  person: one(practicePeople, { fields: [practiceTests.practicePersonId], references: [practicePeople.id] }),
  trainee: one(users, { fields: [practiceTests.traineeUserId], references: [users.id] })
}))
