import { relations } from 'drizzle-orm'
import { boolean, index, jsonb, pgTable, text, uniqueIndex, uuid } from 'drizzle-orm/pg-core'
import { id, timestamps } from './columns'
import { organizations } from './organizations'

/**
 * The organization's catalogue of respirator makes and models. `respiratorClass` is a key of
 * RESPIRATOR_CLASSES in the computation module: it decides the APF and the fit-test pass level.
 */
export const respiratorModels = pgTable('respirator_models', {
  id: id(),
  organizationId: uuid().notNull().references(() => organizations.id, { onDelete: 'cascade' }),
  make: text().notNull(),
  model: text().notNull(),
  respiratorClass: text().notNull(),
  sizes: jsonb().$type<string[]>().notNull().default([]),
  notes: text(),
  active: boolean().notNull().default(true),
  ...timestamps
}, table => [
  index('respirator_models_organization_idx').on(table.organizationId),
  uniqueIndex('respirator_models_make_model_unique').on(table.organizationId, table.make, table.model)
])

export const respiratorModelsRelations = relations(respiratorModels, ({ one }) => ({
  organization: one(organizations, { fields: [respiratorModels.organizationId], references: [organizations.id] })
}))
