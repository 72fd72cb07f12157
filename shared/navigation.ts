import type { Permission } from './permissions'

// Main navigation inside an organisation; each entry shows only to roles with its permission.
export interface NavEntry { label: string; to: (org: string) => string; permission: Permission; testId: string }

export const ORG_NAVIGATION: NavEntry[] = [
  { label: 'Tables', to: org => `/orgs/${org}`, permission: 'tables:read', testId: 'nav-tables' },
  { label: 'Second check', to: org => `/orgs/${org}/reviews`, permission: 'reviews:decide', testId: 'nav-reviews' },
  { label: 'Audit trail', to: org => `/orgs/${org}/audit`, permission: 'tables:read', testId: 'nav-audit' },
  { label: 'Check a file', to: org => `/orgs/${org}/verify`, permission: 'exports:download', testId: 'nav-verify' },
  { label: 'Import', to: org => `/orgs/${org}/imports/new`, permission: 'tables:edit', testId: 'nav-import' },
  { label: 'My work', to: org => `/orgs/${org}/my-work`, permission: 'reviews:submit', testId: 'nav-my-work' },
  { label: 'Members', to: org => `/orgs/${org}/members`, permission: 'members:manage', testId: 'nav-members' },
  { label: 'Billing', to: org => `/orgs/${org}/billing`, permission: 'members:manage', testId: 'nav-billing' },
]
