import { relations, sql } from 'drizzle-orm'
import { date, doublePrecision, index, jsonb, pgTable, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core'
import { IMPORTED_RESULTS, REMINDER_KINDS, REMINDER_TRIGGERS } from '../../../shared/utils/enums'
import { id, oneOf, timestamps } from './columns'
import { organizations } from './organizations'
import { people } from './people'
import { respiratorModels } from './respirators'
import { users } from './users'

/**
 * A medical clearance on file: who cleared the person (a physician or other licensed health-care
 * professional, 29 CFR 1910.134(e)(2)), when, until when, and for which respirator classes.
 * Deliberately no diagnosis or medical detail: only what the program needs to act on.
 */
export const medicalClearances = pgTable('medical_clearances', {
  id: id(),
  organizationId: uuid().notNull().references(() => organizations.id, { onDelete: 'cascade' }),
  personId: uuid().notNull().references(() => people.id, { onDelete: 'cascade' }),
  clearedOn: date({ mode: 'string' }).notNull(),
  /** Last day the clearance holds; null when the clearing professional set no end. */
  validUntil: date({ mode: 'string' }),
  clearedBy: text().notNull(),
  /** Keys of RESPIRATOR_CLASSES in the computation module. */
  respiratorClasses: jsonb().$type<string[]>().notNull(),
  restrictions: text(),
  /** A natural key for imports: the same CSV row imported twice adds nothing. */
  importKey: text(),
  recordedByUserId: uuid().references(() => users.id, { onDelete: 'set null' }),
  ...timestamps
}, table => [
  index('medical_clearances_person_idx').on(table.organizationId, table.personId),
  uniqueIndex('medical_clearances_import_unique').on(table.organizationId, table.importKey)
])

/** The respirators a person is expected to wear: each needs its own passing fit test — (f)(2). */
export const respiratorAssignments = pgTable('respirator_assignments', {
  id: id(),
  organizationId: uuid().notNull().references(() => organizations.id, { onDelete: 'cascade' }),
  personId: uuid().notNull().references(() => people.id, { onDelete: 'cascade' }),
  respiratorModelId: uuid().notNull().references(() => respiratorModels.id, { onDelete: 'cascade' }),
  createdAt: timestamp({ withTimezone: true }).notNull().defaultNow()
}, table => [
  uniqueIndex('respirator_assignments_unique').on(table.personId, table.respiratorModelId)
])

/**
 * Fit tests done before Sealwright, typed in from paper or another system. They count for due
 * dates and fit status, are always shown as imported, and stay out of insights statistics unless
 * they carry an overall fit factor.
 */
export const fitHistoryEntries = pgTable('fit_history_entries', {
  id: id(),
  organizationId: uuid().notNull().references(() => organizations.id, { onDelete: 'cascade' }),
  personId: uuid().notNull().references(() => people.id, { onDelete: 'cascade' }),
  testedOn: date({ mode: 'string' }).notNull(),
  respiratorModelId: uuid().references(() => respiratorModels.id, { onDelete: 'set null' }),
  respiratorMake: text().notNull(),
  respiratorModel: text().notNull(),
  respiratorClass: text().notNull(),
  respiratorSize: text().notNull(),
  passed: text({ enum: IMPORTED_RESULTS }).notNull(),
  overallFitFactor: doublePrecision(),
  testerName: text(),
  dueOn: date({ mode: 'string' }),
  importKey: text().notNull(),
  importedByUserId: uuid().references(() => users.id, { onDelete: 'set null' }),
  createdAt: timestamp({ withTimezone: true }).notNull().defaultNow()
}, table => [
  oneOf('fit_history_entries_passed_check', table.passed, IMPORTED_RESULTS),
  index('fit_history_person_idx').on(table.organizationId, table.personId),
  uniqueIndex('fit_history_import_unique').on(table.organizationId, table.importKey)
])

export const REMINDER_STEPS = ['ahead', 'overdue', 'manual'] as const

/**
 * Every reminder sent: to whom, for which due date and which step. Scheduled steps are unique per
 * (person, due item, due date, step, recipient), so however many instances run the daily job a
 * step is claimed, and mailed, once.
 */
export const reminderLog = pgTable('reminder_log', {
  id: id(),
  organizationId: uuid().notNull().references(() => organizations.id, { onDelete: 'cascade' }),
  personId: uuid().references(() => people.id, { onDelete: 'cascade' }),
  /** 'fit-test:<respirator model id>' or 'clearance'. */
  dueItem: text().notNull(),
  dueOn: date({ mode: 'string' }).notNull(),
  step: text().notNull(),
  recipient: text().notNull(),
  /** 'wearer' for the person's own mail, 'digest' for a tester or admin summary. */
  kind: text({ enum: REMINDER_KINDS }).notNull(),
  trigger: text({ enum: REMINDER_TRIGGERS }).notNull(),
  sentByUserId: uuid().references(() => users.id, { onDelete: 'set null' }),
  /** Null until the mail went out; a failed send stays here with its error. */
  sentAt: timestamp({ withTimezone: true }),
  error: text(),
  createdAt: timestamp({ withTimezone: true }).notNull().defaultNow()
}, table => [
  oneOf('reminder_log_kind_check', table.kind, REMINDER_KINDS),
  oneOf('reminder_log_trigger_check', table.trigger, REMINDER_TRIGGERS),
  index('reminder_log_person_idx').on(table.organizationId, table.personId),
  uniqueIndex('reminder_log_step_unique').on(table.organizationId, table.personId, table.dueItem, table.dueOn, table.step, table.recipient)
    .where(sql`trigger = 'scheduled'`),
  // A digest names no person: one per recipient, day and step.
  uniqueIndex('reminder_log_digest_unique').on(table.organizationId, table.dueItem, table.dueOn, table.step, table.recipient)
    .where(sql`trigger = 'scheduled' and person_id is null`)
])

export const medicalClearancesRelations = relations(medicalClearances, ({ one }) => ({
  person: one(people, { fields: [medicalClearances.personId], references: [people.id] })
}))
