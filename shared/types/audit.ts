export interface AuditEventDto {
  id: string
  /** 'org': this organisation's chain; 'system': the org-less chain (sign-ins of this organisation's members) */
  chain: 'org' | 'system'
  at: string
  actor: { id: string | null; email: string | null; name: string | null }
  action: string
  objectType: string | null
  objectId: string | null
  outcome: 'ok' | 'denied' | 'failed'
  ip: string | null
  detail: Record<string, unknown>
  hash: string
}
export interface AuditPageDto { events: AuditEventDto[]; page: number; pageSize: number; total: number; actions: string[] }
export interface ChainVerdictDto { chain: 'org' | 'system'; events: number; intact: boolean; brokenAt: { id: string; at: string; action: string; reason: string } | null }
export interface AuditVerifyDto { checkedAt: string; chains: ChainVerdictDto[] }
export interface AuditFilterValues { table: string; person: string; action: string; from: string; to: string }
