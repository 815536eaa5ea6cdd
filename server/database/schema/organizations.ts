import { relations } from 'drizzle-orm'
import { index, jsonb, pgTable, text, uniqueIndex, uuid } from 'drizzle-orm/pg-core'
import type { PassLevelOverrides, Protocol } from '../../../shared/utils/compute'
import type { DecimalMark } from '../../../shared/utils/number-reader'
import type { ReminderSettings } from '../../../shared/utils/oversight'
import { id, timestamps } from './columns'

export interface OrganizationSettings {
  /** Months between fit tests; may be shorter than 12, never longer — 29 CFR 1910.134(f)(2). */
  retestIntervalMonths?: number
  /** What to do with a result no passing readiness check covers: only flag it, or refuse it. */
  uncoveredResults?: 'flag' | 'refuse'
  /** Pass levels raised above the rule set (never lower), as the computation module reads them. */
  passLevelOverrides?: PassLevelOverrides
  /** Reminder e-mail: lead time, repeat interval once overdue, which roles get site digests. */
  reminders?: Partial<ReminderSettings>
  /** A test started with no current medical clearance covering the respirator class. */
  clearanceAtStart?: 'flag' | 'require-reason' | 'refuse'
  /** How people here write a decimal: point (default) or comma; the other mark only groups thousands. */
  decimalMark?: DecimalMark
  /** Protocols an admin added, checked with the computation module's protocol schema. */
  customProtocols?: Protocol[]
}

export const organizations = pgTable('organizations', {
  id: id(),
  name: text().notNull(),
  slug: text().notNull(),
  /** Which pass-level rule set applies: 'us-osha' or 'uk-hse'. */
  ruleSet: text().notNull().default('us-osha'),
  settings: jsonb().$type<OrganizationSettings>().notNull().default({}),
  ...timestamps
}, table => [
  uniqueIndex('organizations_slug_unique').on(table.slug)
])

export const sites = pgTable('sites', {
  id: id(),
  organizationId: uuid().notNull().references(() => organizations.id, { onDelete: 'cascade' }),
  name: text().notNull(),
  /** IANA time zone; decides which calendar day a readiness check covers. */
  timeZone: text().notNull(),
  address: text(),
  ...timestamps
}, table => [
  index('sites_organization_idx').on(table.organizationId),
  uniqueIndex('sites_organization_name_unique').on(table.organizationId, table.name)
])

export const organizationsRelations = relations(organizations, ({ many }) => ({
  sites: many(sites)
}))

export const sitesRelations = relations(sites, ({ one }) => ({
  organization: one(organizations, { fields: [sites.organizationId], references: [organizations.id] })
}))
