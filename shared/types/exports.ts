import type { AnchorVerdictDto } from './audit'

// The answer to "is this signed workbook genuine?".
export type ExportVerdictKind = 'genuine-current' | 'genuine-superseded' | 'genuine-unknown-version' | 'altered' | 'unknown-key' | 'not-signed'

export interface ExportVerdictDto {
  verdict: ExportVerdictKind
  message: string
  fileName: string
  checkedAt: string
  keyId?: string
  /** what the signature covers (when it still matches a content) */
  signed?: { tableId: string; tableName: string; version: number; approvedBy: string | null; approvedAt: string | null; signedAt: string; points: number; values: number; format: string } | null
  supersededBy?: number | null
  /** cells that differ from the signed content, like "Filled values!B17" */
  differences?: { cell: string; expected: string | null; found: string | null }[]
  differenceCount?: number
  /** The audit trail's head the file carries (files made since issue 11), against this organisation's trail now. */
  trail?: AnchorVerdictDto | null
}

/** One of the organisation's Ed25519 signing keys, public part only (a JWK with its state). */
export interface SigningKeySummaryDto {
  kid: string
  x: string
  status: 'active' | 'retired'
  createdAt: string
  retiredAt: string | null
}
