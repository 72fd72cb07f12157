import type { VersionStatus } from '../tables'

export interface PersonRef { id: string; name: string; email: string }
export type CommentKind = 'comment' | 'submit' | 'send-back' | 'approve' | 'retire'
export interface VersionCommentDto { id: string; kind: CommentKind; body: string; author: PersonRef | null; createdAt: string }

/** Everything the review panel of one version shows; `you` is worked out on the server for the caller. */
export interface ReviewStateDto {
  versionId: string
  tableName: string
  number: number
  status: VersionStatus
  /** Another version of the table signed off now (a sign-off withdraws it), or null. */
  inForce: number | null
  /** Active read tokens that can read this table (production systems a sign-off or withdrawal reaches). */
  connectedSystems: number
  hasFill: boolean
  /** The recorded fill was fitted on other points than the version holds (only for a draft or a version awaiting a check). */
  fillStale: boolean
  author: PersonRef | null
  filledBy: PersonRef | null
  submittedBy: PersonRef | null
  submittedAt: string | null
  approvedBy: PersonRef | null
  approvedAt: string | null
  retiredBy: PersonRef | null
  retiredAt: string | null
  retireReason: string | null
  supersededBy: number | null
  comments: VersionCommentDto[]
  you: {
    madeThis: boolean; canSubmit: boolean; canDecide: boolean; canRetire: boolean; canExport: boolean
    /** Why a draft cannot be submitted yet (no fill, or a fill fitted on other points), with what to do. */
    submitBlockedReason: string | null
    /** Why nobody can sign it off as it stands (a stale fill): send it back. */
    signOffBlockedReason: string | null
    decideBlockedReason: string | null
  }
}

export interface ReviewQueueItemDto {
  tableId: string
  tableName: string
  versionId: string
  number: number
  submittedBy: PersonRef | null
  submittedAt: string | null
  author: PersonRef | null
  /** true when the caller made, filled or submitted it: someone else must sign it off */
  yours: boolean
}
