// The one permission table (docs/domain.md#permissions). Server handlers call
// requirePermission(); pages and controls call can(). Nothing else decides.

export const ROLES = ['admin', 'actuary', 'analyst', 'auditor'] as const
export type Role = (typeof ROLES)[number]

export const ROLE_LABELS: Record<Role, string> = {
  admin: 'Administrator',
  actuary: 'Actuary',
  analyst: 'Analyst',
  auditor: 'Auditor',
}

export const PERMISSIONS = {
  'tables:read': 'See tables, versions and the audit trail',
  'tables:edit': 'Import spreadsheets and edit draft points',
  'fills:run': 'Run fills and comparisons',
  'reviews:submit': 'Submit a draft for review',
  'reviews:decide': 'Approve or send back someone else\u2019s work',
  'exports:download': 'Download a signed export and verify an export',
  'members:manage': 'Members, roles, invitations, seats and invoices',
} as const
export type Permission = keyof typeof PERMISSIONS

const GRANTS: Record<Role, readonly Permission[]> = {
  admin: ['tables:read', 'exports:download', 'members:manage'],
  actuary: ['tables:read', 'tables:edit', 'fills:run', 'reviews:submit', 'reviews:decide', 'exports:download'],
  analyst: ['tables:read', 'tables:edit', 'fills:run', 'reviews:submit'],
  auditor: ['tables:read', 'exports:download'],
}

export function can(role: Role | null | undefined, permission: Permission): boolean {
  return !!role && GRANTS[role].includes(permission)
}

export function permissionsOf(role: Role): readonly Permission[] {
  return GRANTS[role]
}
