import type { Role } from '#shared/utils/roles'
import { roleAllows } from '#shared/utils/roles'

export interface NavItem {
  to: string
  label: string
  /** Roles that may use the page; admins see everything. Empty: every signed-in role. */
  roles: Role[]
}

export const NAV_ITEMS: NavItem[] = [
  { to: '/', label: 'Overview', roles: [] },
  { to: '/equipment/checks', label: 'Readiness checks', roles: ['tester', 'reviewer', 'trainer'] },
  { to: '/equipment/headform', label: 'Headform test', roles: ['tester'] },
  { to: '/equipment/masks', label: 'Mask units', roles: ['tester', 'reviewer', 'trainer'] },
  { to: '/equipment/counters', label: 'Counters and rigs', roles: ['tester', 'reviewer', 'trainer'] },
  { to: '/equipment/templates', label: 'Check templates', roles: ['tester', 'reviewer', 'trainer'] },
  { to: '/admin/users', label: 'Users', roles: ['admin'] },
  { to: '/admin/outbox', label: 'Outbox', roles: ['admin'] },
  { to: '/admin/settings', label: 'Settings', roles: ['admin'] }
]

export function navFor(role: Role | undefined): NavItem[] {
  if (!role) return []
  return NAV_ITEMS.filter(item => item.roles.length === 0 || roleAllows(role, item.roles))
}
