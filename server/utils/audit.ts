import type { H3Event } from 'h3'
import type { Transaction } from 'sequelize'
import type { AuditContent } from '../lib/audit-chain'
import { appendAuditEvent } from '../services/audit-writer'

export interface AuditInput {
  orgId?: string | null
  action: string
  objectType?: string
  objectId?: string
  outcome?: 'ok' | 'denied' | 'failed'
  detail?: Record<string, unknown>
  actor?: { id: string; email: string } | null
  /** where the request came from, for an event written later by a run (no request at hand) */
  origin?: { requestId: string | null; ip: string | null }
}

/** Appends an audit event; pass the change's transaction so both commit together. */
export async function audit(event: H3Event | null, input: AuditInput, transaction?: Transaction): Promise<void> {
  const actor = input.actor !== undefined ? input.actor : (event?.context.auth?.user ?? null)
  const content: AuditContent = {
    orgId: input.orgId ?? null,
    actorId: actor?.id ?? null,
    actorEmail: actor?.email ?? null,
    action: input.action,
    objectType: input.objectType ?? null,
    objectId: input.objectId ?? null,
    outcome: input.outcome ?? 'ok',
    requestId: event?.context.requestId ?? input.origin?.requestId ?? null,
    ip: event ? clientAddress(event) : (input.origin?.ip ?? null),
    detail: input.detail ?? {},
    at: new Date().toISOString(),
  }
  if (transaction) await appendAuditEvent(useDb(), content, transaction)
  else await inTransaction(t => appendAuditEvent(useDb(), content, t))
}
