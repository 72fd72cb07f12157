import type { Permission } from './permissions'

// Main navigation inside an organisation; each entry shows only to roles with its permission.
export interface NavEntry { label: string; to: (org: string) => string; permission: Permission; testId: string }

export const ORG_NAVIGATION: NavEntry[] = [
  { label: 'Tables', to: org => `/orgs/${org}`, permission: 'tables:read', testId: 'nav-tables' },
  { label: 'Members', to: org => `/orgs/${org}/members`, permission: 'members:manage', testId: 'nav-members' },
]
