import { boolean, index, integer, jsonb, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core'
import { CHECK_STATUSES, TEMPLATE_SCOPES } from '../../../shared/utils/readiness-schemas'
import type { ReadinessStep, StepEntry } from '../../../shared/utils/readiness-schemas'
import { id, oneOf, timestamps } from './columns'
import { benchRigs, counters } from './equipment'
import { maskTypes } from './masks'
import { organizations, sites } from './organizations'
import { users } from './users'

/** An admin's ordered list of steps for a counter alone or for a bench rig. */
export const readinessTemplates = pgTable('readiness_templates', {
  id: id(),
  organizationId: uuid().notNull().references(() => organizations.id, { onDelete: 'cascade' }),
  name: text().notNull(),
  scope: text({ enum: TEMPLATE_SCOPES }).notNull(),
  steps: jsonb().$type<ReadinessStep[]>().notNull(),
  /** Seeded with the organization: our own defaults, to be confirmed against the instrument's documentation. */
  isDefault: boolean().notNull().default(false),
  active: boolean().notNull().default(true),
  ...timestamps
}, table => [
  oneOf('readiness_templates_scope_check', table.scope, TEMPLATE_SCOPES),
  index('readiness_templates_organization_idx').on(table.organizationId)
])

/**
 * One run of a template on one counter (or bench rig with its counter). The steps are copied in
 * when the check starts, so a later template edit never changes a finished record. Saved after
 * every step; locked once it has ended.
 */
export const readinessChecks = pgTable('readiness_checks', {
  id: id(),
  organizationId: uuid().notNull().references(() => organizations.id, { onDelete: 'cascade' }),
  templateId: uuid().references(() => readinessTemplates.id, { onDelete: 'set null' }),
  templateName: text().notNull(),
  counterId: uuid().notNull().references(() => counters.id, { onDelete: 'restrict' }),
  benchRigId: uuid().references(() => benchRigs.id, { onDelete: 'restrict' }),
  siteId: uuid().references(() => sites.id, { onDelete: 'set null' }),
  maskTypeId: uuid().references(() => maskTypes.id, { onDelete: 'set null' }),
  steps: jsonb().$type<ReadinessStep[]>().notNull(),
  /** Indexes into `steps` skipped because the mask type on the headform lacks the part. */
  skippedSteps: jsonb().$type<number[]>().notNull().default([]),
  entries: jsonb().$type<StepEntry[]>().notNull().default([]),
  currentStep: integer().notNull().default(0),
  status: text({ enum: CHECK_STATUSES }).notNull().default('in-progress'),
  abandonReason: text(),
  startedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  completedAt: timestamp({ withTimezone: true }),
  performedBy: uuid().references(() => users.id, { onDelete: 'set null' }),
  ...timestamps
}, table => [
  oneOf('readiness_checks_status_check', table.status, CHECK_STATUSES),
  index('readiness_checks_organization_completed_idx').on(table.organizationId, table.completedAt),
  index('readiness_checks_counter_idx').on(table.counterId)
])
