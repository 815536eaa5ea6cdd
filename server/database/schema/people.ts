import { relations } from 'drizzle-orm'
import { boolean, date, index, pgTable, text, uniqueIndex, uuid } from 'drizzle-orm/pg-core'
import { MEDICAL_CLEARANCE_STATUSES } from '../../../shared/utils/enums'
import { id, oneOf, timestamps } from './columns'
import { organizations, sites } from './organizations'
import { users } from './users'

/** The people a program fits: respirator wearers. A wearer account may be linked to one. */
export const people = pgTable('people', {
  id: id(),
  organizationId: uuid().notNull().references(() => organizations.id, { onDelete: 'cascade' }),
  siteId: uuid().references(() => sites.id, { onDelete: 'set null' }),
  userId: uuid().references(() => users.id, { onDelete: 'set null' }),
  fullName: text().notNull(),
  employeeNumber: text(),
  jobTitle: text(),
  email: text(),
  medicalClearanceOn: date({ mode: 'string' }),
  medicalClearanceStatus: text({ enum: MEDICAL_CLEARANCE_STATUSES }).notNull().default('pending'),
  notes: text(),
  /** The wearer asked for no reminder e-mail; they still appear in every due list. */
  reminderOptOut: boolean().notNull().default(false),
  active: boolean().notNull().default(true),
  ...timestamps
}, table => [
  oneOf('people_medical_clearance_status_check', table.medicalClearanceStatus, MEDICAL_CLEARANCE_STATUSES),
  index('people_organization_idx').on(table.organizationId),
  uniqueIndex('people_employee_number_unique').on(table.organizationId, table.employeeNumber),
  index('people_user_idx').on(table.userId)
])

export const peopleRelations = relations(people, ({ one }) => ({
  organization: one(organizations, { fields: [people.organizationId], references: [organizations.id] }),
  site: one(sites, { fields: [people.siteId], references: [sites.id] }),
  user: one(users, { fields: [people.userId], references: [users.id] })
}))
