/** The five roles of DOMAIN.md. The server is the gate; the client only hides what a role cannot use. */
export const ROLES = ['admin', 'tester', 'reviewer', 'trainer', 'wearer'] as const
export type Role = typeof ROLES[number]

export const ROLE_LABELS: Record<Role, string> = {
  admin: 'Program administrator',
  tester: 'Fit tester',
  reviewer: 'Industrial hygienist',
  trainer: 'Trainer',
  wearer: 'Respirator wearer'
}

export const ROLE_DESCRIPTIONS: Record<Role, string> = {
  admin: 'Everything in the organization: users, sites, catalogue and policies.',
  tester: 'Runs readiness checks, records fit tests and headform tests, manages people and masks.',
  reviewer: 'Reads everything, reviews and countersigns results, insights and exports.',
  trainer: 'Uses the training lab and demo data; read-only elsewhere.',
  wearer: 'Sees their own records, fit card and due dates.'
}

/** True when `role` is one of `allowed`; an admin may do everything in their organization. */
export function roleAllows(role: Role, allowed: readonly Role[]): boolean {
  return role === 'admin' || allowed.includes(role)
}
