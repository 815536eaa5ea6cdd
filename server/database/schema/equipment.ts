import { relations } from 'drizzle-orm'
import { boolean, date, doublePrecision, index, pgTable, text, uniqueIndex, uuid } from 'drizzle-orm/pg-core'
import { id, timestamps } from './columns'
import { organizations, sites } from './organizations'

/** Particle counters. Their sample flow sets the counted volume behind every fit factor. */
export const counters = pgTable('counters', {
  id: id(),
  organizationId: uuid().notNull().references(() => organizations.id, { onDelete: 'cascade' }),
  siteId: uuid().references(() => sites.id, { onDelete: 'set null' }),
  serialNumber: text().notNull(),
  description: text().notNull().default(''),
  sampleFlowCm3PerMin: doublePrecision().notNull(),
  /** After this date the counter's results are flagged; warned 30 days ahead. */
  calibrationDueOn: date({ mode: 'string' }),
  active: boolean().notNull().default(true),
  ...timestamps
}, table => [
  index('counters_organization_idx').on(table.organizationId),
  uniqueIndex('counters_serial_unique').on(table.organizationId, table.serialNumber)
])

/** Headform, hood and aerosol source, paired with the counter that samples it. */
export const benchRigs = pgTable('bench_rigs', {
  id: id(),
  organizationId: uuid().notNull().references(() => organizations.id, { onDelete: 'cascade' }),
  siteId: uuid().references(() => sites.id, { onDelete: 'set null' }),
  serialNumber: text().notNull(),
  description: text().notNull().default(''),
  counterId: uuid().notNull().references(() => counters.id, { onDelete: 'restrict' }),
  active: boolean().notNull().default(true),
  ...timestamps
}, table => [
  index('bench_rigs_organization_idx').on(table.organizationId),
  uniqueIndex('bench_rigs_serial_unique').on(table.organizationId, table.serialNumber)
])

export const countersRelations = relations(counters, ({ one }) => ({
  organization: one(organizations, { fields: [counters.organizationId], references: [organizations.id] }),
  site: one(sites, { fields: [counters.siteId], references: [sites.id] })
}))

export const benchRigsRelations = relations(benchRigs, ({ one }) => ({
  organization: one(organizations, { fields: [benchRigs.organizationId], references: [organizations.id] }),
  site: one(sites, { fields: [benchRigs.siteId], references: [sites.id] }),
  counter: one(counters, { fields: [benchRigs.counterId], references: [counters.id] })
}))
