import { QueryTypes } from 'sequelize'
import type { OutgoingMail } from '../utils/mail'

// Review notifications. Sent after the change has committed; a failure to send is logged, never fatal.
const esc = (v: string) => v.replace(/[&<>"']/g, c => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', '\'': '&#39;' })[c]!)

function compose(to: string, subject: string, lines: string[], link: string, label: string): OutgoingMail {
  const html = `<div style="font-family:sans-serif;font-size:15px;line-height:1.5;color:#1f2a24;max-width:560px">
${lines.map(l => `<p>${esc(l)}</p>`).join('\n')}
<p><a href="${esc(link)}" style="display:inline-block;background:#2f5d46;color:#fff;padding:10px 16px;border-radius:4px;text-decoration:none">${esc(label)}</a></p></div>`
  return { to, subject, text: `${lines.join('\n\n')}\n\n${label}: ${link}\n`, html }
}

export interface ReviewMailContext { orgId: string; orgSlug: string; orgName: string; tableId: string; tableName: string; number: number; actorName: string }

const versionLink = (c: ReviewMailContext) => appLink(`/orgs/${c.orgSlug}/tables/${c.tableId}?v=${c.number}#review`)

async function emailsOf(sql: string, replacements: Record<string, unknown>): Promise<string[]> {
  const rows = await useDb().query<{ email: string }>(sql, { replacements, type: QueryTypes.SELECT })
  return [...new Set(rows.map(r => r.email))]
}

function deliver(mails: OutgoingMail[], what: string) {
  for (const mail of mails) sendMail(mail).catch(error => console.error(`[mail] ${what} to ${mail.to} not sent: ${(error as Error).message}`))
}

/** To every actuary of the organisation who did not make the version. */
export async function notifyReviewRequested(c: ReviewMailContext, makerIds: string[], note: string | undefined) {
  try {
    const to = await emailsOf(`SELECT u.email FROM memberships m JOIN users u ON u.id = m.user_id
      WHERE m.org_id = :orgId AND m.role = 'actuary' AND NOT (u.id = ANY(ARRAY[:makers]::uuid[]))`, { orgId: c.orgId, makers: makerIds.length ? makerIds : ['00000000-0000-0000-0000-000000000000'] })
    const lines = [`${c.actorName} asks for a second check of ${c.tableName}, version ${c.number} (${c.orgName}).`, ...(note ? [`Their note: ${note}`] : [])]
    deliver(to.map(addr => compose(addr, `Second check requested: ${c.tableName} v${c.number}`, lines, versionLink(c), 'Open the version')), 'review request')
  } catch (error) {
    console.error(`[mail] review request for ${c.tableName} v${c.number} not sent: ${(error as Error).message}`)
  }
}

/** To the people who made the version: signed off or sent back, with the comment. */
export async function notifyReviewDecided(c: ReviewMailContext, makerIds: string[], decision: 'approved' | 'sent back', comment: string | undefined) {
  try {
    const to = await emailsOf('SELECT email FROM users WHERE id = ANY(ARRAY[:ids]::uuid[])', { ids: makerIds.length ? makerIds : ['00000000-0000-0000-0000-000000000000'] })
    const lines = [
      decision === 'approved' ? `${c.actorName} signed off ${c.tableName}, version ${c.number} (${c.orgName}).` : `${c.actorName} sent ${c.tableName}, version ${c.number} back to you (${c.orgName}).`,
      ...(comment ? [`Comment: ${comment}`] : []),
    ]
    deliver(to.map(addr => compose(addr, `${decision === 'approved' ? 'Signed off' : 'Sent back'}: ${c.tableName} v${c.number}`, lines, versionLink(c), 'Open the version')), `review decision (${decision})`)
  } catch (error) {
    console.error(`[mail] review decision for ${c.tableName} v${c.number} not sent: ${(error as Error).message}`)
  }
}
