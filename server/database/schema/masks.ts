import { boolean, doublePrecision, index, integer, jsonb, pgTable, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core'
import { MASK_UNIT_STATES } from '../../../shared/utils/mask-schemas'
import { id, oneOf, timestamps } from './columns'
import { benchRigs, counters } from './equipment'
import { organizations, sites } from './organizations'
import { respiratorModels } from './respirators'
import { users } from './users'

/** A kind of mask with the parts that decide which steps and sub-checks apply, and its headform rules. */
export const maskTypes = pgTable('mask_types', {
  id: id(),
  organizationId: uuid().notNull().references(() => organizations.id, { onDelete: 'cascade' }),
  name: text().notNull(),
  hasDrinkTube: boolean().notNull().default(false),
  hasExhalationValve: boolean().notNull().default(false),
  /** Null: the labelled default of the computation module. */
  headformPassLevel: doublePrecision(),
  headformRetestDays: integer().notNull(),
  ...timestamps
}, table => [
  uniqueIndex('mask_types_organization_name_unique').on(table.organizationId, table.name)
])

export const maskUnits = pgTable('mask_units', {
  id: id(),
  organizationId: uuid().notNull().references(() => organizations.id, { onDelete: 'cascade' }),
  serialNumber: text().notNull(),
  respiratorModelId: uuid().notNull().references(() => respiratorModels.id, { onDelete: 'restrict' }),
  maskTypeId: uuid().notNull().references(() => maskTypes.id, { onDelete: 'restrict' }),
  size: text().notNull(),
  siteId: uuid().references(() => sites.id, { onDelete: 'set null' }),
  state: text({ enum: MASK_UNIT_STATES }).notNull().default('in-service'),
  ...timestamps
}, table => [
  oneOf('mask_units_state_check', table.state, MASK_UNIT_STATES),
  index('mask_units_organization_idx').on(table.organizationId),
  uniqueIndex('mask_units_serial_unique').on(table.organizationId, table.serialNumber)
])

/** Every change of a unit's state, with its reason: the unit's history. */
export const maskUnitEvents = pgTable('mask_unit_events', {
  id: id(),
  organizationId: uuid().notNull().references(() => organizations.id, { onDelete: 'cascade' }),
  maskUnitId: uuid().notNull().references(() => maskUnits.id, { onDelete: 'cascade' }),
  fromState: text({ enum: MASK_UNIT_STATES }),
  toState: text({ enum: MASK_UNIT_STATES }).notNull(),
  reason: text().notNull(),
  headformTestId: uuid(),
  /** A return to service that a program admin allowed without a passing headform test since the hold. */
  override: boolean().notNull().default(false),
  actorUserId: uuid().references(() => users.id, { onDelete: 'set null' }),
  at: timestamp({ withTimezone: true }).notNull().defaultNow()
}, table => [
  oneOf('mask_unit_events_from_state_check', table.fromState, MASK_UNIT_STATES),
  oneOf('mask_unit_events_to_state_check', table.toState, MASK_UNIT_STATES),
  index('mask_unit_events_unit_idx').on(table.maskUnitId, table.at)
])

/**
 * Raw inputs of a headform test only; the bench protection factor and the verdict are recomputed
 * with the computation module whenever the test is read. The pass level is kept as it stood then.
 */
export const headformTests = pgTable('headform_tests', {
  id: id(),
  organizationId: uuid().notNull().references(() => organizations.id, { onDelete: 'cascade' }),
  maskUnitId: uuid().notNull().references(() => maskUnits.id, { onDelete: 'restrict' }),
  benchRigId: uuid().notNull().references(() => benchRigs.id, { onDelete: 'restrict' }),
  counterId: uuid().notNull().references(() => counters.id, { onDelete: 'restrict' }),
  siteId: uuid().references(() => sites.id, { onDelete: 'set null' }),
  performedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  performedBy: uuid().references(() => users.id, { onDelete: 'set null' }),
  outside: doublePrecision().notNull(),
  inside: doublePrecision().notNull(),
  sampleSeconds: doublePrecision().notNull(),
  sampleFlowCm3PerMin: doublePrecision().notNull(),
  passLevel: doublePrecision().notNull(),
  passLevelIsDefault: boolean().notNull(),
  subChecks: jsonb().$type<Record<string, boolean>>().notNull().default({}),
  /**
   * The verdict as recomputed when the test was saved, kept only so queries can find the last
   * passing test (the retest interval runs from a pass, never from a failure). Null on tests saved
   * before it was kept: those never count as a pass.
   */
  passed: boolean(),
  notes: text().notNull().default(''),
  ...timestamps
}, table => [
  index('headform_tests_unit_idx').on(table.maskUnitId, table.performedAt),
  index('headform_tests_organization_idx').on(table.organizationId, table.performedAt)
])
