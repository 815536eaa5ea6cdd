import type { Role } from '#shared/utils/roles'
import type { Permission } from '#shared/utils/permissions'
import { roleMay } from '#shared/utils/permissions'

export interface NavItem {
  to: string
  label: string
  /** What a role must be allowed to do to see the item (shared/utils/permissions.ts); null: every signed-in role. */
  may: Permission | null
}

export const NAV_ITEMS: NavItem[] = [
  { to: '/', label: 'Overview', may: null },
  { to: '/fit-tests', label: 'Fit tests', may: 'read-program' },
  { to: '/people', label: 'People', may: 'read-program' },
  { to: '/due', label: 'Due list', may: 'read-program' },
  { to: '/fit-tests', label: 'My fit tests', may: 'own-status' },
  { to: '/insights', label: 'Insights', may: 'see-insights' },
  { to: '/reviews', label: 'Review queue', may: 'review' },
  { to: '/calculator', label: 'Protection calculator', may: 'read-program' },
  { to: '/equipment/checks', label: 'Readiness checks', may: 'read-program' },
  { to: '/equipment/headform', label: 'Headform test', may: 'record' },
  { to: '/equipment/masks', label: 'Mask units', may: 'read-program' },
  { to: '/equipment/counters', label: 'Counters and rigs', may: 'read-program' },
  { to: '/equipment/templates', label: 'Readiness templates', may: 'read-program' },
  { to: '/lab', label: 'Training lab', may: 'use-lab' },
  { to: '/admin/catalogue', label: 'Catalogue', may: 'administer' },
  { to: '/admin/pass-levels', label: 'Pass levels', may: 'administer' },
  { to: '/admin/protocols', label: 'Protocols', may: 'administer' },
  { to: '/admin/users', label: 'Users', may: 'administer' },
  { to: '/admin/outbox', label: 'Outbox', may: 'administer' },
  { to: '/admin/settings', label: 'Settings', may: 'administer' }
]

export function navFor(role: Role | undefined): NavItem[] {
  if (!role) return []
  const items = NAV_ITEMS.filter(item => item.may === null || roleMay(role, item.may))
  // "My fit tests" is the wearer's name for the same page; everyone else sees "Fit tests".
  return items.filter(item => role === 'wearer' ? item.label !== 'Fit tests' : item.label !== 'My fit tests')
}
