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

export interface InvitationDto {
  id: string
  email: string
  role: Role
  invitedBy: string | null
  sentAt: string
  expiresAt: string
  expired: boolean
}

export interface SeatsDto {
  purchased: number
  members: number
  pending: number
  used: number
}

/** What the invitation page shows to whoever holds the link. */
export interface InvitationPreviewDto {
  org: { name: string; slug: string }
  email: string
  role: Role
  expiresAt: string
  hasAccount: boolean
  signedInAs: string | null
}

export interface BillingInvoiceDto {
  id: string
  number: string | null
  status: string
  reason: string | null
  amountDue: number
  amountPaid: number
  currency: string
  periodStart: string | null
  periodEnd: string | null
  created: string
  hostedUrl: string | null
}

export interface BillingDto {
  plan: { name: string; unitAmount: number; currency: string; interval: string }
  seats: SeatsDto
  status: string
  currentPeriodEnd: string | null
  card: { brand: string; last4: string } | null
  cardEntryUrl: string | null
  invoices: BillingInvoiceDto[]
  syncedAt: string | null
  /** set when the payment service could not be reached: the figures are the last ones stored */
  stale: boolean
}

export interface BillingStatusDto {
  status: string
  attention: boolean
}

/** What changing the seats will charge now (a preview from the payment service), shown before the change is confirmed. */
export interface SeatsPreviewDto {
  from: number
  to: number
  /** Charged to the card at once, in minor units (0 for a decrease or during a trial). */
  amountDue: number
  /** The proration on its own: negative for a decrease (a credit kept for the next invoices). */
  prorated: number
  currency: string
  /** The moment the preview was priced at (unix seconds); the confirmed change uses it, so it charges exactly amountDue. */
  prorationDate: number
  periodEnd: string | null
  /** The monthly amount at the new count, in minor units. */
  monthlyAfter: number
  card: { brand: string; last4: string } | null
  trial: boolean
}
