// Audit events as sentences with names ("Signed off version 3 of Pensioner mortality, male."), for the audit trail page
// and its CSV. The stored record (ids, keys) stays as it was hashed; these words are made from it when it is read.
import type { MethodListing } from './engine/contract'
import { auditActionLabel } from './audit-actions'
import { methodWords } from './fill-words'
import { groupThousands } from './plain-text'

export interface AuditFacts {
  action: string
  outcome: 'ok' | 'denied' | 'failed'
  objectType: string | null
  objectId: string | null
  detail: Record<string, unknown>
}
/** Names for ids, looked up when the trail is read (null: no longer held). */
export interface AuditNames { table(id: string): string | null; person(id: string): string | null }

const ROLES: Record<string, string> = { admin: 'administrator', actuary: 'actuary', analyst: 'analyst', auditor: 'auditor' }
const VERDICTS: Record<string, string> = {
  'genuine-current': 'genuine, and still the signed-off version', 'genuine-superseded': 'genuine, but since superseded or withdrawn',
  'genuine-unknown-version': 'genuine, for a version no longer held', 'altered': 'changed after signing', 'unknown-key': 'signed with a key that is not ours', 'not-signed': 'not a signed file',
}
const STATUS: Record<string, string> = { active: 'in good standing', trialing: 'on trial', past_due: 'payment overdue', unpaid: 'unpaid', incomplete: 'first payment outstanding', canceled: 'ended' }

const str = (v: unknown) => (typeof v === 'string' ? v : typeof v === 'number' ? String(v) : '')
const quote = (v: unknown) => { const s = str(v).trim(); return s ? `“${s.length > 160 ? `${s.slice(0, 157)}…` : s}”` : '' }
const plural = (n: number, one: string, many = `${one}s`) => `${groupThousands(n)} ${n === 1 ? one : many}`
const kb = (bytes: number) => (bytes >= 1_048_576 ? `${(bytes / 1_048_576).toFixed(1)} MB` : `${Math.max(1, Math.round(bytes / 1024))} kB`)
const shortKey = (kid: unknown) => (str(kid) ? `${str(kid).slice(0, 8)}…` : 'a key')

/** One sentence for one event. `methods` gives the words of a fill's method and options. */
export function describeAuditEvent(e: AuditFacts, names: AuditNames, methods: readonly MethodListing[] = []): string {
  const d = e.detail
  const tableId = str(d.tableId) || (e.objectType === 'rate_table' ? str(e.objectId) : '')
  const table = (tableId && names.table(tableId)) || str(d.table) || str(d.name) || 'a table no longer held'
  const version = `version ${str(d.number)} of ${table}`
  const person = (e.objectId && names.person(e.objectId)) || str(d.email) || 'a former member'
  const role = ROLES[str(d.role)] ?? str(d.role)
  switch (e.action) {
    case 'auth.sign-in':
      if (e.outcome === 'ok') return 'Signed in.'
      return `Sign-in for ${str(d.email) || 'an address'} refused: ${d.reason === 'throttled' ? 'too many attempts from one place, so it was held back' : 'wrong e-mail or password'}.`
    case 'auth.sign-out': return 'Signed out.'
    case 'auth.password-change': return 'Changed their password; their other sessions were ended.'
    case 'auth.password-reset-request': return `Asked for a password reset link for ${str(d.email)}.`
    case 'auth.password-reset': return 'Set a new password with a reset link.'
    case 'billing.start': return `Billing started with ${plural(Number(d.seats ?? 0), 'seat')} (${STATUS[str(d.status)] ?? str(d.status)}).`
    case 'billing.seats-change': return `Changed the seats from ${str(d.from)} to ${str(d.to)}; the difference for the rest of the period was invoiced.`
    case 'billing.sync': {
      const from = (d.from ?? {}) as Record<string, unknown>
      const to = (d.to ?? {}) as Record<string, unknown>
      const changes = [from.seats !== to.seats ? `seats ${str(from.seats) || '—'} → ${str(to.seats)}` : '', from.status !== to.status ? `status ${STATUS[str(from.status)] ?? (str(from.status) || 'none')} → ${STATUS[str(to.status)] ?? str(to.status)}` : ''].filter(Boolean)
      return `Billing brought up to date from the payment service${changes.length ? `: ${changes.join(', ')}` : ''}.`
    }
    case 'export.download': return `Downloaded the signed workbook of ${version}.`
    case 'export.verify': return `Checked the file ${quote(d.fileName)}: ${VERDICTS[str(d.verdict)] ?? str(d.verdict)}${d.version ? ` (version ${str(d.version)})` : ''}${Number(d.differences) ? `, ${plural(Number(d.differences), 'cell')} differ` : ''}.`
    case 'import.upload': return `Uploaded ${quote(d.fileName)} (${Array.isArray(d.sheets) ? plural(d.sheets.length, 'sheet') : 'a file'}, ${kb(Number(d.sizeBytes ?? 0))}).`
    case 'import.commit': {
      const made = Array.isArray(d.tables) ? d.tables.map(id => names.table(str(id)) ?? 'a table no longer held') : []
      return `Created ${plural(made.length, 'table')} from ${quote(d.fileName)}, sheet ${quote(d.sheet)}: ${made.join(', ')}${Array.isArray(d.acceptedWarnings) && d.acceptedWarnings.length ? `; ${plural(d.acceptedWarnings.length, 'warning')} accepted` : ''}.`
    }
    case 'import.discard': return `Discarded the upload ${quote(d.fileName)}.`
    case 'invitation.create': return `Invited ${str(d.email)} as ${role} (${str(d.seatsUsed)} of ${str(d.seats)} seats in use).`
    case 'invitation.accept': return `${str(d.email)} accepted the invitation as ${role}.`
    case 'invitation.cancel': return `Cancelled the invitation of ${str(d.email)} (${role}).`
    case 'invitation.resend': return `Sent the invitation to ${str(d.email)} again.`
    case 'member.add': return `${person} joined as ${role}${d.via === 'invitation' ? ' through an invitation' : d.via === 'sign-up' ? ' when the organisation was set up' : ''}.`
    case 'member.remove': return `Removed ${person} (was ${role}).`
    case 'member.role-change': return `Changed the role of ${person} from ${ROLES[str(d.from)] ?? str(d.from)} to ${ROLES[str(d.to)] ?? str(d.to)}.`
    case 'org.create': return `Created the organisation ${str(d.name)}.`
    case 'signing-key.create': return `Created the organisation's signing key ${shortKey(d.kid)}.`
    case 'signing-key.rotate': return `Replaced the signing key${Array.isArray(d.retired) && d.retired.length ? ` ${shortKey(d.retired[0])}` : ''} by ${shortKey(d.created)}; files signed with the old key still verify.`
    case 'read-token.create': return `Created the read token ${quote(d.name)} for ${Array.isArray(d.tables) ? `the tables ${d.tables.map(str).join(', ')}` : 'every signed-off table'}.`
    case 'read-token.revoke': return `Revoked the read token ${quote(d.name)}.`
    case 'read-token.read': return `The connected system ${quote(d.token)} read ${version}.`
    case 'table.create': return `Created the ${d.shape === 'two-way' ? 'two-way ' : ''}table ${table}${d.importId ? ' from an upload' : ''}.`
    case 'table.update': {
      const changes = Object.entries((d.changes ?? {}) as Record<string, unknown>).map(([k, v]) => (k === 'tags' && Array.isArray(v) ? `tags ${v.join(', ') || 'none'}` : `${k === 'valueUnit' ? 'unit' : k === 'axisUnit' ? 'axis unit' : k} ${quote(v) || str(v)}`))
      return `Changed the details of ${table}${changes.length ? `: ${changes.join('; ')}` : ''}.`
    }
    case 'version.create': return d.from ? `Started ${version} from version ${str(d.from)}.` : `Created ${version} with ${d.cells !== undefined ? plural(Number(d.cells), 'given cell') : plural(Number(d.points ?? 0), 'given point')}.`
    case 'version.points.save': return `Saved ${d.cells !== undefined ? plural(Number(d.cells), 'given cell') : plural(Number(d.points ?? 0), 'given point')} in ${version}.`
    case 'version.fill.save': {
      if (d.shape === 'two-way') return `Chose ${str(d.label)} (a method per axis) as the fill of ${version} (${plural(Number(d.cells ?? 0), 'value')}). Reasons: ${quote(d.rationale)}`
      const listing = methods.find(m => m.id === d.method)
      const method = listing ? methodWords(listing, str(d.method), (d.options ?? {}) as Record<string, string>) : str(d.label) || str(d.method)
      return `Chose ${method} as the fill of ${version} (${plural(Number(d.points ?? 0), 'value')}). Reasons: ${quote(d.rationale)}`
    }
    case 'version.graduate': return `Graduated version ${str(d.from)} into ${version} by Whittaker-Henderson (order ${str(d.order)}, smoothing ${str(d.smoothing)}, weights ${d.weights === 'exposure' ? 'from exposures' : d.weights === 'one' ? 'equal' : str(d.weights)}). Reasons: ${quote(d.rationale)}`
    case 'version.submit': return `Submitted ${version} for a second check${d.note ? `: ${quote(d.note)}` : '.'}`
    case 'version.approve':
      if (e.outcome !== 'ok') return `Tried to sign off ${version}; refused, because they made, filled or submitted it.`
      return `Signed off ${version}${Array.isArray(d.supersedes) && d.supersedes.length ? `, which withdrew version ${d.supersedes.map(str).join(', ')}` : ''}${d.comment ? `: ${quote(d.comment)}` : '.'}`
    case 'version.send-back': return `Sent ${version} back: ${quote(d.comment)}`
    case 'version.retire': return `Withdrew ${version}: ${quote(d.reason)}`
    case 'version.supersede': return `${version[0]!.toUpperCase()}${version.slice(1)} was superseded by version ${str(d.supersededBy)}.`
    case 'version.comment': return `Commented on ${version}.`
    default: return `${auditActionLabel(e.action)}.`
  }
}
