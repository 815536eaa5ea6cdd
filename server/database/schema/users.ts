import { relations } from 'drizzle-orm'
import { bigint, boolean, index, integer, pgEnum, pgTable, text, timestamp, uniqueIndex, uuid, varchar } from 'drizzle-orm/pg-core'
import { ROLES } from '../../../shared/utils/roles'
import { TOKEN_PURPOSES } from '../../../shared/utils/enums'
import { id, oneOf, timestamps } from './columns'
import { organizations } from './organizations'

export const userRole = pgEnum('user_role', ROLES)

export const users = pgTable('users', {
  id: id(),
  organizationId: uuid().notNull().references(() => organizations.id, { onDelete: 'cascade' }),
  /**
   * Stored lower-case; unique within an organization. One person (a consultant fit tester, say)
   * may hold accounts in several organizations under one address; the password picks the account.
   */
  email: text().notNull(),
  /** Null until an invited user sets a password. */
  passwordHash: text(),
  displayName: text().notNull(),
  role: userRole().notNull(),
  active: boolean().notNull().default(true),
  lastSignInAt: timestamp({ withTimezone: true }),
  /**
   * Every session cookie carries the version it was issued under; raising it ends all of this
   * user's sessions at once (sign-out everywhere, password reset, deactivation).
   */
  sessionVersion: integer().notNull().default(1),
  ...timestamps
}, table => [
  uniqueIndex('users_organization_email_unique').on(table.organizationId, table.email),
  index('users_email_idx').on(table.email),
  index('users_organization_idx').on(table.organizationId)
])

/** Single-use links sent by e-mail: invitations and password resets. Only a hash of the token is kept. */
export const authTokens = pgTable('auth_tokens', {
  id: id(),
  organizationId: uuid().notNull().references(() => organizations.id, { onDelete: 'cascade' }),
  userId: uuid().notNull().references(() => users.id, { onDelete: 'cascade' }),
  purpose: text({ enum: TOKEN_PURPOSES }).notNull(),
  tokenHash: text().notNull(),
  expiresAt: timestamp({ withTimezone: true }).notNull(),
  usedAt: timestamp({ withTimezone: true }),
  createdAt: timestamp({ withTimezone: true }).notNull().defaultNow()
}, table => [
  oneOf('auth_tokens_purpose_check', table.purpose, TOKEN_PURPOSES),
  uniqueIndex('auth_tokens_hash_unique').on(table.tokenHash),
  index('auth_tokens_user_idx').on(table.userId)
])

/**
 * Sign-in and reset attempt counters kept by rate-limiter-flexible (its PostgreSQL store, column
 * names as it expects), shared by every app instance. Not tenant data: keys are hashed.
 */
export const rateLimits = pgTable('rate_limits', {
  key: varchar({ length: 255 }).primaryKey(),
  points: integer().notNull().default(0),
  expire: bigint({ mode: 'number' })
})

export const usersRelations = relations(users, ({ one }) => ({
  organization: one(organizations, { fields: [users.organizationId], references: [organizations.id] })
}))
