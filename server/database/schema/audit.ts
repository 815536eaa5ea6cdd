import { bigserial, index, jsonb, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core'
import { organizations } from './organizations'
import { users } from './users'

/**
 * Append-only trail of every change: a database trigger refuses UPDATE and DELETE
 * (see the custom migration), so a record of who changed what cannot be rewritten.
 */
export const auditEvents = pgTable('audit_events', {
  id: bigserial({ mode: 'number' }).primaryKey(),
  organizationId: uuid().notNull().references(() => organizations.id, { onDelete: 'restrict' }),
  actorUserId: uuid().references(() => users.id, { onDelete: 'set null' }),
  at: timestamp({ withTimezone: true }).notNull().defaultNow(),
  entityType: text().notNull(),
  entityId: text().notNull(),
  action: text().notNull(),
  before: jsonb(),
  after: jsonb()
}, table => [
  index('audit_events_organization_at_idx').on(table.organizationId, table.at),
  index('audit_events_entity_idx').on(table.entityType, table.entityId)
])
