import type { Role } from './roles'

/**
 * The one permission table: what each role may do, read by `requireRole` on the server (the real
 * gate), the route middleware (`definePageMeta({ may })`), the navigation and every button that a
 * role may not use. A program administrator may do everything in their organization, so `admin`
 * is never listed. The roles and what they may do are DEVELOPERS.md "Roles"; a test walks this
 * table against it (tests/unit/permissions.test.ts).
 */
export const PERMISSIONS = {
  /** Users, sites, catalogue, pass levels, protocols, settings, the outbox. */
  'administer': [],
  /** Run readiness checks, record, correct and withdraw fit tests and headform tests, manage people and masks. */
  'record': ['tester'],
  /** Read the program's records: fit tests, people, due list, equipment, the protection calculator. */
  'read-program': ['tester', 'reviewer', 'trainer'],
  /** Read fit-test records; a wearer reads only their own. */
  'read-fit-tests': ['tester', 'reviewer', 'trainer', 'wearer'],
  /** Countersign or query results; exposure assessments and protection gaps. */
  'review': ['reviewer'],
  /** Export records as CSV. */
  'export': ['tester', 'reviewer'],
  /** The insights panels. */
  'see-insights': ['reviewer', 'tester'],
  /** The training lab, and writing practice tests (never program records). */
  'use-lab': ['trainer', 'tester'],
  /** Read practice sets and practice tests. */
  'read-practice': ['trainer', 'tester', 'reviewer'],
  /** Clear a whole practice set. */
  'clear-practice': ['trainer'],
  /** A wearer's own fit standing, card and reminders. */
  'own-status': ['wearer']
} as const satisfies Record<string, readonly Exclude<Role, 'admin'>[]>

export type Permission = keyof typeof PERMISSIONS

export const PERMISSION_NAMES = Object.keys(PERMISSIONS) as Permission[]

/** True when `role` may do `permission`; an admin may do everything in their organization. */
export function roleMay(role: Role | null | undefined, permission: Permission): boolean {
  if (!role) return false
  return role === 'admin' || (PERMISSIONS[permission] as readonly Role[]).includes(role)
}
