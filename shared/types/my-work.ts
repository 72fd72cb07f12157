import type { VersionStatus } from '../tables'
import type { ImportDto } from './tables'

/** One of the caller's own uploads not yet turned into tables (kept until `expiresAt`, 24 h after the upload). */
export type MyUploadDto = ImportDto

/** A version the caller submitted for a second check, with where it stands now. */
export interface MySubmissionDto {
  tableId: string
  tableName: string
  number: number
  status: VersionStatus
  /** in-review: awaiting; approved or retired: signed off; draft: sent back (its newest send-back comment in `reason`) */
  outcome: 'awaiting' | 'signed-off' | 'sent-back'
  submittedAt: string
  /** when it was signed off or sent back */
  decidedAt: string | null
  reason: string | null
}
