import { describe, expect, it } from 'vitest'
import { PERMISSION_NAMES, PERMISSIONS, roleMay } from '../../shared/utils/permissions'
import type { Permission } from '../../shared/utils/permissions'
import { ROLES } from '../../shared/utils/roles'
import type { Role } from '../../shared/utils/roles'

// The role table of DEVELOPERS.md "Roles" (the program's own role definitions), one row per
// permission: which of admin, tester, reviewer, trainer, wearer may, and the words of the table
// that say so. Source for every row: DEVELOPERS.md "Roles" (our own product decision, no
// published source).
const Y = true
const N = false
const EXPECTED: [Permission, [admin: boolean, tester: boolean, reviewer: boolean, trainer: boolean, wearer: boolean], string][] = [
  ['administer', [Y, N, N, N, N], 'admin: users, sites, catalogue, policies'],
  ['record', [Y, Y, N, N, N], 'tester: run readiness checks, record fit tests and headform tests, manage people and masks; trainer: never program records'],
  ['read-program', [Y, Y, Y, Y, N], 'reviewer: read everything; trainer: read-only elsewhere; wearer: only their own'],
  ['read-fit-tests', [Y, Y, Y, Y, Y], 'wearer: their own records (the route narrows to them)'],
  ['review', [Y, N, Y, N, N], 'reviewer: countersign or query results, exposure assessments'],
  ['export', [Y, Y, Y, N, N], 'reviewer: exports; tester: export'],
  ['see-insights', [Y, Y, Y, N, N], 'reviewer: insights; tester: insights of the tests they run'],
  ['use-lab', [Y, Y, N, Y, N], 'trainer: the training lab and practice tests; tester: the training lab'],
  ['read-practice', [Y, Y, Y, Y, N], 'reviewer: read everything'],
  ['clear-practice', [Y, N, N, Y, N], 'trainer: the training lab and practice tests (clearing a practice set is theirs)'],
  ['own-status', [Y, N, N, N, Y], 'wearer: their own card and due dates']
]

describe('the permission table', () => {
  it('has a row in DEVELOPERS.md\'s role table for every permission, and no more', () => {
    expect(EXPECTED.map(([p]) => p).sort()).toEqual([...PERMISSION_NAMES].sort())
  })

  const cases = EXPECTED.flatMap(([permission, allowed, source]) =>
    ROLES.map((role, i) => ({ permission, role, may: allowed[i]!, source })))
  it.each(cases)('$role may $permission: $may ($source)', ({ permission, role, may }) => {
    expect(roleMay(role, permission)).toBe(may)
  })

  it('lets an admin do everything in their organization (DEVELOPERS.md "Roles": admin)', () => {
    for (const permission of PERMISSION_NAMES) expect(roleMay('admin', permission)).toBe(true)
  })

  it('never lets a trainer or a wearer change a program record (DEVELOPERS.md "Roles")', () => {
    for (const role of ['trainer', 'wearer'] as Role[]) {
      expect(roleMay(role, 'record')).toBe(false)
      expect(roleMay(role, 'administer')).toBe(false)
      expect(roleMay(role, 'review')).toBe(false)
    }
  })

  it('lets nobody who is not signed in do anything', () => {
    for (const permission of PERMISSION_NAMES) expect(roleMay(undefined, permission)).toBe(false)
  })

  it('lists only real roles, never admin (who may everything anyway)', () => {
    for (const roles of Object.values(PERMISSIONS)) {
      for (const role of roles as readonly string[]) {
        expect(ROLES).toContain(role)
        expect(role).not.toBe('admin')
      }
    }
  })
})
