// The fake mail inbox that scripts/test.sh started (KW_MAIL_INBOX_URL), read over its HTTP API. No imports from the
// other helpers, so helpers.ts can use it (sign-up goes through an e-mailed link).
export const INBOX = (process.env.KW_MAIL_INBOX_URL ?? '').replace(/\/+$/, '')
const APP = process.env.KW_BASE_URL ?? 'http://127.0.0.1:3000'

export interface Mail { id: string; to: string[]; subject: string; text: string; html: string | null }

/** The newest message to an address whose subject contains the words; waits up to 10 s for it to arrive. */
export async function waitForMail(to: string, subject: string, notId?: string): Promise<Mail> {
  for (let i = 0; i < 100; i++) {
    const res = await fetch(`${INBOX}/messages?${new URLSearchParams({ to, subject })}`)
    const list = await res.json() as Mail[]
    const found = list.find(m => m.id !== notId)
    if (found) return found
    await new Promise(r => setTimeout(r, 100))
  }
  throw new Error(`no mail to ${to} about "${subject}" in ${INBOX}`)
}

export async function mailsTo(to: string): Promise<Mail[]> {
  return await (await fetch(`${INBOX}/messages?${new URLSearchParams({ to })}`)).json() as Mail[]
}

/** The token at the end of a link to the given path on the app's address (`app`: another node's) in a mail's text (e.g. /invitations/<token>). */
export function tokenIn(mail: Mail, path: string, app = APP): string {
  const m = new RegExp(`${app.replace(/[.:/]/g, '\\$&')}${path}/([A-Za-z0-9_-]+)`).exec(mail.text)
  if (!m) throw new Error(`no ${path} link in: ${mail.text}`)
  return m[1]!
}
