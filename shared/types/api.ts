import type { Role } from '../permissions'

export interface MembershipDto {
  org: { id: string; slug: string; name: string }
  role: Role
}

export interface MeDto {
  user: { id: string; email: string; name: string }
  memberships: MembershipDto[]
}

export interface MemberDto {
  userId: string
  name: string
  email: string
  role: Role
  joinedAt: string
}

export interface TableSummaryDto {
  id: string
  name: string
  kind: import('../tables').TableKind
  axis: import('../tables').Axis
  valueUnit: import('../tables').ValueUnit
  tags: string[]
  versions: number
  latest: { number: number; status: import('../tables').VersionStatus; updatedAt: string } | null
  approvedNumber: number | null
  updatedAt: string
}
