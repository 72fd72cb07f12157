import { describe, expect, it } from 'vitest'
import { can, PERMISSIONS, ROLES, type Permission, type Role } from '#shared/permissions'

// docs/domain.md#permissions, transcribed row by row: the table the product must enforce.
const TABLE: Record<Permission, Record<Role, boolean>> = {
  'tables:read': { admin: true, actuary: true, analyst: true, auditor: true },
  'tables:edit': { admin: false, actuary: true, analyst: true, auditor: false },
  'fills:run': { admin: false, actuary: true, analyst: true, auditor: false },
  'reviews:submit': { admin: false, actuary: true, analyst: true, auditor: false },
  'reviews:decide': { admin: false, actuary: true, analyst: false, auditor: false },
  'exports:download': { admin: true, actuary: true, analyst: false, auditor: true },
  'members:manage': { admin: true, actuary: false, analyst: false, auditor: false },
}

describe('permission table', () => {
  it('covers every permission the product defines', () => {
    expect(Object.keys(TABLE).sort()).toEqual(Object.keys(PERMISSIONS).sort())
  })
  for (const permission of Object.keys(TABLE) as Permission[]) {
    for (const role of ROLES) {
      it(`${role} ${TABLE[permission][role] ? 'may' : 'may not'} ${permission}`, () => {
        expect(can(role, permission)).toBe(TABLE[permission][role])
      })
    }
  }
  it('grants nothing without a role', () => {
    expect(can(null, 'tables:read')).toBe(false)
    expect(can(undefined, 'members:manage')).toBe(false)
  })
  it('keeps auditors read-only', () => {
    const writes: Permission[] = ['tables:edit', 'fills:run', 'reviews:submit', 'reviews:decide', 'members:manage']
    expect(writes.some(p => can('auditor', p))).toBe(false)
  })
})
