export interface AuditEventDto {
  id: string
  /** The event's number in its trail: this organisation's trail counts 1, 2, 3, ... without gaps; the system trail (sign-ins) has its own count. */
  number: number
  /** 'org': this organisation's chain; 'system': the org-less chain (sign-ins of this organisation's members) */
  chain: 'org' | 'system'
  at: string
  actor: { id: string | null; email: string | null; name: string | null }
  action: string
  /** What happened, as a sentence with names (shared/audit-words.ts). */
  sentence: string
  objectType: string | null
  objectId: string | null
  outcome: 'ok' | 'denied' | 'failed'
  ip: string | null
  hash: string
}
export interface AuditPageDto { events: AuditEventDto[]; page: number; pageSize: number; total: number; actions: string[] }
export interface ChainVerdictDto {
  chain: 'org' | 'system'
  events: number
  intact: boolean
  brokenAt: { id: string; number: number; at: string; action: string; reason: string } | null
  /** Numbers missing from the trail's own count (an event removed from the middle). The system trail is shown in part, so no gaps are reported for it. */
  gaps: { from: number; to: number }[]
  /** The newest event of the chain as it stands. */
  head: { number: number; hash: string; at: string } | null
}
/** How the trail stands against an anchor: a signed checkpoint, or a head the reader holds (from an export, a read-API answer, a CSV). */
export interface AnchorVerdictDto {
  source: 'checkpoint' | 'given' | 'file'
  number: number
  hash: string
  /** when the anchor was stated (checkpoints and files) */
  statedAt: string | null
  reason: string | null
  /** the anchor's own signature holds under the organisation's keys (null: a head typed in, nothing to check) */
  genuine: boolean | null
  state: 'present' | 'missing' | 'different' | 'not-genuine'
  missing: { from: number; to: number } | null
  message: string
}
export interface AuditVerifyDto {
  checkedAt: string
  chains: ChainVerdictDto[]
  /** Signed checkpoints that fail, or the newest one when all hold; then the head given in the request, if any. */
  anchors: AnchorVerdictDto[]
  checkpoints: number
}
export interface AuditFilterValues { table: string; person: string; action: string; from: string; to: string }
