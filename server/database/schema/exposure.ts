import { relations } from 'drizzle-orm'
import { boolean, doublePrecision, index, integer, jsonb, pgTable, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core'
import type { AssessmentStoredInput } from '../../../shared/utils/exposure-schemas'
import { EXPOSURE_ASSESSMENT_STATUSES } from '../../../shared/utils/enums'
import { id, oneOf, timestamps } from './columns'
import { organizations, sites } from './organizations'
import { people } from './people'
import { users } from './users'

/**
 * A saved protection-calculator result for a job or work area. A chain of revisions shares
 * `recordId`; a signed-off revision is never edited: a correction is a new revision with a reason,
 * and signing it off marks the earlier one superseded. `input` is the truth; the stored ratio and
 * IDLH flag only serve lists and are recomputed from it on every save.
 */
export const exposureAssessments = pgTable('exposure_assessments', {
  id: id(),
  organizationId: uuid().notNull().references(() => organizations.id, { onDelete: 'cascade' }),
  recordId: uuid().notNull(),
  revision: integer().notNull().default(1),
  revisionReason: text(),
  status: text({ enum: EXPOSURE_ASSESSMENT_STATUSES }).notNull().default('draft'),
  version: integer().notNull().default(1),
  title: text().notNull(),
  siteId: uuid().references(() => sites.id, { onDelete: 'set null' }),
  ruleSet: text().notNull(),
  input: jsonb().$type<AssessmentStoredInput>().notNull(),
  chosenClassKeys: jsonb().$type<string[]>().notNull().default([]),
  rationale: text().notNull().default(''),
  requiredProtectionFactor: doublePrecision().notNull(),
  idlhAtmosphere: boolean().notNull().default(false),
  createdByUserId: uuid().notNull().references(() => users.id, { onDelete: 'restrict' }),
  signedOffByUserId: uuid().references(() => users.id, { onDelete: 'restrict' }),
  signedOffAt: timestamp({ withTimezone: true }),
  ...timestamps
}, table => [
  oneOf('exposure_assessments_status_check', table.status, EXPOSURE_ASSESSMENT_STATUSES),
  index('exposure_assessments_organization_idx').on(table.organizationId),
  index('exposure_assessments_record_idx').on(table.recordId),
  uniqueIndex('exposure_assessments_record_revision_unique').on(table.recordId, table.revision)
])

/**
 * Who works under an assessment: one person, or everyone in the roster with a job title. Kept per
 * record, so a revision keeps its people.
 */
export const exposureAssignments = pgTable('exposure_assignments', {
  id: id(),
  organizationId: uuid().notNull().references(() => organizations.id, { onDelete: 'cascade' }),
  recordId: uuid().notNull(),
  personId: uuid().references(() => people.id, { onDelete: 'cascade' }),
  jobTitle: text(),
  createdByUserId: uuid().notNull().references(() => users.id, { onDelete: 'restrict' }),
  ...timestamps
}, table => [
  index('exposure_assignments_record_idx').on(table.organizationId, table.recordId),
  uniqueIndex('exposure_assignments_person_unique').on(table.recordId, table.personId),
  uniqueIndex('exposure_assignments_job_unique').on(table.recordId, table.jobTitle)
])

export const exposureAssessmentsRelations = relations(exposureAssessments, ({ one }) => ({
  organization: one(organizations, { fields: [exposureAssessments.organizationId], references: [organizations.id] }),
  site: one(sites, { fields: [exposureAssessments.siteId], references: [sites.id] })
}))

export const exposureAssignmentsRelations = relations(exposureAssignments, ({ one }) => ({
  person: one(people, { fields: [exposureAssignments.personId], references: [people.id] })
}))
