import { relations } from 'drizzle-orm'
import { boolean, index, integer, pgEnum, pgTable, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core'
import { ROLES } from '../../../shared/utils/roles'
import { id, timestamps } from './columns'
import { organizations } from './organizations'

export const userRole = pgEnum('user_role', ROLES)

export const users = pgTable('users', {
  id: id(),
  organizationId: uuid().notNull().references(() => organizations.id, { onDelete: 'cascade' }),
  /** Stored lower-case; unique across the whole service because it is the sign-in name. */
  email: text().notNull(),
  /** Null until an invited user sets a password. */
  passwordHash: text(),
  displayName: text().notNull(),
  role: userRole().notNull(),
  active: boolean().notNull().default(true),
  lastSignInAt: timestamp({ withTimezone: true }),
  ...timestamps
}, table => [
  uniqueIndex('users_email_unique').on(table.email),
  index('users_organization_idx').on(table.organizationId)
])

/** Single-use links sent by e-mail: invitations and password resets. Only a hash of the token is kept. */
export const authTokens = pgTable('auth_tokens', {
  id: id(),
  organizationId: uuid().notNull().references(() => organizations.id, { onDelete: 'cascade' }),
  userId: uuid().notNull().references(() => users.id, { onDelete: 'cascade' }),
  purpose: text().$type<'invitation' | 'password-reset'>().notNull(),
  tokenHash: text().notNull(),
  expiresAt: timestamp({ withTimezone: true }).notNull(),
  usedAt: timestamp({ withTimezone: true }),
  createdAt: timestamp({ withTimezone: true }).notNull().defaultNow()
}, table => [
  uniqueIndex('auth_tokens_hash_unique').on(table.tokenHash),
  index('auth_tokens_user_idx').on(table.userId)
])

/** Failed sign-ins counted per e-mail and per client address, for throttling. Not tenant data. */
export const signInFailures = pgTable('sign_in_failures', {
  key: text().primaryKey(),
  failures: integer().notNull().default(0),
  windowStartedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  lockedUntil: timestamp({ withTimezone: true })
})

export const usersRelations = relations(users, ({ one }) => ({
  organization: one(organizations, { fields: [users.organizationId], references: [organizations.id] })
}))
