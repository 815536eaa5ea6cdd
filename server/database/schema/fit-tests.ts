import { relations } from 'drizzle-orm'
import { boolean, date, doublePrecision, index, integer, jsonb, pgTable, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core'
import type { FitTestEntry, PreTestChecks } from '../../../shared/utils/fit-test-schemas'
import type { Protocol } from '../../../shared/utils/compute'
import type { Evaluation } from '../../../shared/utils/fit-test-evaluate'
import { FIT_TEST_KINDS, FIT_TEST_STATUSES } from '../../../shared/utils/enums'
import { id, oneOf, timestamps } from './columns'
import { counters } from './equipment'
import { maskUnits } from './masks'
import { organizations, sites } from './organizations'
import { people } from './people'
import { respiratorModels } from './respirators'
import { users } from './users'

/** What the start of a test found about medical clearance, kept on the record and shown with the result. */
export interface ClearanceAtStart {
  onFile: boolean
  clearanceId: string | null
  validUntil: string | null
  /** Why the tester went ahead without a current clearance covering this respirator class. */
  reason: string | null
}

/**
 * One revision of a fit-test record. All revisions of a record share `recordId`; a finished
 * revision is never edited — a correction is a new revision (with a reason) that supersedes it.
 * Holds every field 29 CFR 1910.134(m)(2) asks for. The raw inputs (`entry`) are the truth;
 * overall/pass/limiting are recomputed by the server from them and kept only for queries.
 */
export const fitTests = pgTable('fit_tests', {
  id: id(),
  organizationId: uuid().notNull().references(() => organizations.id, { onDelete: 'cascade' }),
  recordId: uuid().notNull(),
  revision: integer().notNull().default(1),
  revisionReason: text(),
  status: text({ enum: FIT_TEST_STATUSES }).notNull().default('draft'),
  /** Optimistic lock for drafts: every save must send the version it read. */
  version: integer().notNull().default(1),
  idempotencyKey: text(),

  personId: uuid().notNull().references(() => people.id, { onDelete: 'restrict' }),
  siteId: uuid().notNull().references(() => sites.id, { onDelete: 'restrict' }),
  testerUserId: uuid().notNull().references(() => users.id, { onDelete: 'restrict' }),
  counterId: uuid().references(() => counters.id, { onDelete: 'restrict' }),
  respiratorModelId: uuid().notNull().references(() => respiratorModels.id, { onDelete: 'restrict' }),
  /** Make, model, style and size as they were on the day: the record must not change if the catalogue does. */
  respiratorMake: text().notNull(),
  respiratorModel: text().notNull(),
  respiratorClass: text().notNull(),
  respiratorSize: text().notNull(),
  /** The serial-numbered unit the wearer used, when the model's units are tracked. */
  maskUnitId: uuid().references(() => maskUnits.id, { onDelete: 'restrict' }),

  kind: text({ enum: FIT_TEST_KINDS }).notNull().default('quantitative'),
  protocolKey: text().notNull(),
  protocol: jsonb().$type<Protocol>(),
  /** Counter flow at the time of the test, cm³/min. */
  sampleFlowCm3PerMin: doublePrecision(),
  performedAt: timestamp({ withTimezone: true }).notNull(),
  preTest: jsonb().$type<PreTestChecks>().notNull(),
  entry: jsonb().$type<FitTestEntry>().notNull(),
  /** The original pasted or uploaded count series, byte for byte, and its SHA-256. */
  seriesText: text(),
  seriesSha256: text(),

  passLevel: doublePrecision(),
  overallFitFactor: doublePrecision(),
  overallIsLowerBound: boolean(),
  passed: boolean(),
  limitingExerciseKey: text(),
  dueOn: date({ mode: 'string' }),
  /**
   * The server's recomputation of the raw inputs, written when the revision is finished, so that
   * reading a finished record never re-parses its series. `tests/api/stored-results.test.ts`
   * checks that recomputing from the raw inputs gives exactly this. Null on drafts and on rows
   * loaded before it existed (those are recomputed on read).
   */
  evaluation: jsonb().$type<Evaluation>(),
  finishedAt: timestamp({ withTimezone: true }),
  finishedByUserId: uuid().references(() => users.id, { onDelete: 'restrict' }),
  withdrawnReason: text(),
  /** A draft started by mistake is discarded with a reason (audited), never deleted. */
  discardedReason: text(),
  /** The failed record this test retests. */
  retestOfRecordId: uuid(),
  clearanceAtStart: jsonb().$type<ClearanceAtStart>(),
  ...timestamps
}, table => [
  oneOf('fit_tests_status_check', table.status, FIT_TEST_STATUSES),
  oneOf('fit_tests_kind_check', table.kind, FIT_TEST_KINDS),
  index('fit_tests_organization_performed_idx').on(table.organizationId, table.performedAt),
  // The list's total counts one line per record from this index alone, without reading the rows.
  index('fit_tests_organization_status_idx').on(table.organizationId, table.status, table.revision),
  index('fit_tests_person_idx').on(table.personId),
  index('fit_tests_record_idx').on(table.recordId),
  uniqueIndex('fit_tests_record_revision_unique').on(table.recordId, table.revision),
  uniqueIndex('fit_tests_idempotency_unique').on(table.organizationId, table.idempotencyKey)
])

/**
 * A wearer's fit card: an unguessable token that a public page verifies. One per finished, passing
 * revision, so a card printed before a correction verifies as superseded rather than showing the
 * corrected data under the old print. Cards made before revisions had their own (`fitTestId`
 * null) stand for their record's current revision.
 */
export const fitCards = pgTable('fit_cards', {
  id: id(),
  organizationId: uuid().notNull().references(() => organizations.id, { onDelete: 'cascade' }),
  recordId: uuid().notNull(),
  fitTestId: uuid().references(() => fitTests.id, { onDelete: 'cascade' }),
  token: text().notNull(),
  createdAt: timestamp({ withTimezone: true }).notNull().defaultNow()
}, table => [
  uniqueIndex('fit_cards_token_unique').on(table.token),
  index('fit_cards_record_idx').on(table.recordId),
  uniqueIndex('fit_cards_fit_test_unique').on(table.fitTestId)
])

export const fitTestsRelations = relations(fitTests, ({ one }) => ({
  organization: one(organizations, { fields: [fitTests.organizationId], references: [organizations.id] }),
  person: one(people, { fields: [fitTests.personId], references: [people.id] }),
  site: one(sites, { fields: [fitTests.siteId], references: [sites.id] }),
  tester: one(users, { fields: [fitTests.testerUserId], references: [users.id] }),
  counter: one(counters, { fields: [fitTests.counterId], references: [counters.id] }),
  respirator: one(respiratorModels, { fields: [fitTests.respiratorModelId], references: [respiratorModels.id] })
}))
