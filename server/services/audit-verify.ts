import { QueryTypes } from 'sequelize'
import { firstBrokenLink, type ChainRow } from '../lib/audit-chain'
import { headSignatureHolds, type ChainHead, type HeadStatement } from '../lib/signing'
import { formatUtc } from '#shared/plain-text'
import type { AnchorVerdictDto, AuditVerifyDto, ChainVerdictDto } from '#shared/types/audit'
import { ensureDailyCheckpoint, listCheckpoints, type OrgRef } from './audit-anchor'
import { toContent } from './audit-trail'

// Checks a trail three ways: every link of the hash chain (a changed or removed event in the middle breaks one), the
// numbering (a removed event in the middle leaves a gap), and the anchors: signed checkpoints and a head the reader
// holds. Removing the newest events leaves a shorter chain that still links up; only an anchor it no longer reaches
// shows that, and names the missing events by number.
type Row = Record<string, unknown>
interface TrailEvent { number: number; hash: string }

async function chainRows(chain: 'org' | 'system', orgId: string): Promise<(ChainRow & { number: number })[]> {
  const rows = await useDb().query<Row>(`SELECT * FROM audit_events WHERE org_id ${chain === 'org' ? '= :orgId' : 'IS NULL'} ORDER BY seq`, { replacements: { orgId }, type: QueryTypes.SELECT })
  return rows.map(r => ({ ...toContent(r), id: String(r.id), prevHash: (r.prev_hash as string | null) ?? null, hash: r.hash as string, number: Number(r.seq) }))
}

function verifyChain(chain: 'org' | 'system', rows: (ChainRow & { number: number })[]): ChainVerdictDto {
  const broken = firstBrokenLink(rows)
  const at = broken ? rows.find(r => r.id === broken.id)! : null
  const gaps: { from: number; to: number }[] = []
  let expected = 1
  for (const r of rows) {
    if (r.number > expected) gaps.push({ from: expected, to: r.number - 1 })
    expected = r.number + 1
  }
  const last = rows.at(-1)
  return {
    chain, events: rows.length, intact: !broken && (chain === 'system' || !gaps.length),
    brokenAt: broken && at ? { id: broken.id, number: at.number, at: at.at, action: at.action, reason: broken.reason } : null,
    gaps: chain === 'org' ? gaps : [],
    head: last ? { number: last.number, hash: last.hash, at: last.at } : null,
  }
}

const range = (m: { from: number; to: number }) => (m.from === m.to ? `Event #${m.from} is` : `Events #${m.from} to #${m.to} are`)

/** Where the trail stands against one anchor (a head someone recorded): still there, missing, or rewritten. */
export function anchorVerdict(events: Map<number, TrailEvent>, last: number, head: { number: number; hash: string }, meta: Omit<AnchorVerdictDto, 'number' | 'hash' | 'state' | 'missing' | 'message'>): AnchorVerdictDto {
  const what = meta.source === 'checkpoint' ? `the signed checkpoint of ${formatUtc(meta.statedAt)} (${meta.reason === 'sign-off' ? 'at a sign-off' : 'daily'})`
    : meta.source === 'file' ? `the signed file made ${formatUtc(meta.statedAt)}` : 'the event you gave'
  const base = { ...meta, number: head.number, hash: head.hash }
  if (meta.genuine === false) return { ...base, state: 'not-genuine', missing: null, message: `${what[0]!.toUpperCase()}${what.slice(1)} does not carry a valid signature of this organisation: it was not written by Knotwork.` }
  const found = events.get(head.number)
  if (!found && head.number > last) {
    const missing = { from: last + 1, to: head.number }
    return { ...base, state: 'missing', missing, message: `${range(missing)} missing: ${what} records event #${head.number} (hash ${head.hash.slice(0, 12)}…), but the trail now ends at #${last}.` }
  }
  if (!found) return { ...base, state: 'missing', missing: { from: head.number, to: head.number }, message: `Event #${head.number}, recorded in ${what}, is missing from the trail.` }
  if (found.hash !== head.hash) return { ...base, state: 'different', missing: null, message: `Event #${head.number} no longer has the hash ${what} records: the trail was rewritten at or before that event.` }
  return { ...base, state: 'present', missing: null, message: `The trail still holds event #${head.number} with the hash ${what} records.` }
}

async function trailIndex(orgId: string): Promise<{ events: Map<number, TrailEvent>; last: number }> {
  const rows = await useDb().query<{ seq: string; hash: string }>('SELECT seq, hash FROM audit_events WHERE org_id = :orgId', { replacements: { orgId }, type: QueryTypes.SELECT })
  const events = new Map(rows.map(r => [Number(r.seq), { number: Number(r.seq), hash: r.hash }]))
  return { events, last: Math.max(0, ...events.keys()) }
}

/** A head carried by a signed file (export or read-API answer) against the trail now. */
export async function compareWithTrail(orgId: string, head: ChainHead, statedAt: string): Promise<AnchorVerdictDto> {
  const { events, last } = await trailIndex(orgId)
  return anchorVerdict(events, last, head, { source: 'file', statedAt, reason: null, genuine: true })
}

/** Re-computes every hash of both chains, checks the numbering, and compares the trail with every signed checkpoint and a given head. */
export async function verifyAudit(org: OrgRef, keys: (kid: string) => Promise<string | null>, given?: { number: number; hash: string }): Promise<AuditVerifyDto> {
  await ensureDailyCheckpoint(org)
  const orgRows = await chainRows('org', org.id)
  const events = new Map(orgRows.map(r => [r.number, { number: r.number, hash: r.hash }]))
  const last = orgRows.at(-1)?.number ?? 0
  const checkpoints = await listCheckpoints(org.id)
  const verdicts: AnchorVerdictDto[] = []
  for (const cp of checkpoints) {
    const statement = JSON.parse(cp.statement) as HeadStatement
    if (!statement.head) continue
    const x = await keys(cp.keyId)
    const genuine = !!x && headSignatureHolds({ statement, signature: cp.signature }, x)
    verdicts.push(anchorVerdict(events, last, statement.head, { source: 'checkpoint', statedAt: statement.statedAt, reason: cp.reason, genuine }))
  }
  const failing = verdicts.filter(v => v.state !== 'present')
  const anchors = failing.length ? failing : verdicts.slice(-1)
  if (given) anchors.push(anchorVerdict(events, last, given, { source: 'given', statedAt: null, reason: null, genuine: null }))
  return { checkedAt: new Date().toISOString(), chains: [verifyChain('org', orgRows), verifyChain('system', await chainRows('system', org.id))], anchors, checkpoints: checkpoints.length }
}
