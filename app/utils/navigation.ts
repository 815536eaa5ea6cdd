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
  { to: '/fit-tests', label: 'Fit tests', roles: ['tester', 'reviewer', 'trainer'] },
  { to: '/people', label: 'People', roles: ['tester', 'reviewer', 'trainer'] },
  { to: '/due', label: 'Due list', roles: ['tester', 'reviewer', 'trainer'] },
  { to: '/fit-tests', label: 'My fit tests', roles: ['wearer'] },
  { to: '/insights', label: 'Insights', roles: ['reviewer', 'tester'] },
  { to: '/reviews', label: 'Review queue', roles: ['reviewer'] },
  { to: '/calculator', label: 'Protection calculator', roles: ['tester', 'reviewer', 'trainer'] },
  { to: '/equipment/checks', label: 'Readiness checks', roles: ['tester', 'reviewer', 'trainer'] },
  { to: '/equipment/headform', label: 'Headform test', roles: ['tester'] },
  { to: '/equipment/masks', label: 'Mask units', roles: ['tester', 'reviewer', 'trainer'] },
  { to: '/equipment/counters', label: 'Counters and rigs', roles: ['tester', 'reviewer', 'trainer'] },
  { to: '/equipment/templates', label: 'Readiness templates', roles: ['tester', 'reviewer', 'trainer'] },
  { to: '/lab', label: 'Training lab', roles: ['trainer', 'tester'] },
  { to: '/admin/catalogue', label: 'Catalogue', roles: ['admin'] },
  { to: '/admin/pass-levels', label: 'Pass levels', roles: ['admin'] },
  { to: '/admin/protocols', label: 'Protocols', roles: ['admin'] },
  { to: '/admin/users', label: 'Users', roles: ['admin'] },
  { to: '/admin/outbox', label: 'Outbox', roles: ['admin'] },
  { to: '/admin/settings', label: 'Settings', roles: ['admin'] }
]

export function navFor(role: Role | undefined): NavItem[] {
  if (!role) return []
  const items = NAV_ITEMS.filter(item => item.roles.length === 0 || roleAllows(role, item.roles))
  // "My fit tests" is the wearer's name for the same page; everyone else sees "Fit tests".
  return items.filter(item => role === 'wearer' ? item.label !== 'Fit tests' : item.label !== 'My fit tests')
}
