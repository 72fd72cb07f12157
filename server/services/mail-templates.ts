import { ROLE_LABELS, type Role } from '#shared/permissions'
import type { OutgoingMail } from '../utils/mail'

const esc = (v: string) => v.replace(/[&<>"']/g, c => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', '\'': '&#39;' })[c]!)

function html(paragraphs: string[], link: { href: string; label: string }): string {
  return `<div style="font-family:sans-serif;font-size:15px;line-height:1.5;color:#1f2a24;max-width:560px">
${paragraphs.map(p => `<p>${esc(p)}</p>`).join('\n')}
<p><a href="${esc(link.href)}" style="display:inline-block;background:#2f5d46;color:#fff;padding:10px 16px;border-radius:4px;text-decoration:none">${esc(link.label)}</a></p>
<p style="color:#5b6660;font-size:13px">Or open this address: ${esc(link.href)}</p></div>`
}

export function invitationMail(to: string, orgName: string, inviter: string, role: Role, link: string, expiresAt: Date): OutgoingMail {
  const lines = [
    `${inviter} invites you to join ${orgName} on Knotwork as ${ROLE_LABELS[role]}.`,
    `The link works once and until ${expiresAt.toUTCString()}. If you did not expect this, ignore this message.`,
  ]
  return { to, subject: `Join ${orgName} on Knotwork`, text: `${lines.join('\n\n')}\n\nAccept the invitation: ${link}\n`, html: html(lines, { href: link, label: 'Accept the invitation' }) }
}

export function passwordResetMail(to: string, link: string): OutgoingMail {
  const lines = [
    'Someone (we hope you) asked to set a new password for your Knotwork account.',
    'The link works once, for one hour. Setting a new password signs you out everywhere. If you did not ask, ignore this message: your password stays as it is.',
  ]
  return { to, subject: 'Set a new Knotwork password', text: `${lines.join('\n\n')}\n\nSet a new password: ${link}\n`, html: html(lines, { href: link, label: 'Set a new password' }) }
}

export function signupLinkMail(to: string, link: string, hours: number): OutgoingMail {
  const lines = [
    'Someone (we hope you) asked to open a Knotwork account with this e-mail address.',
    `To finish, open the link, name your organisation and choose a password. The link works once, for ${hours} hours. If you did not ask, ignore this message: no account is made.`,
  ]
  return { to, subject: 'Finish creating your Knotwork account', text: `${lines.join('\n\n')}\n\nFinish creating your account: ${link}\n`, html: html(lines, { href: link, label: 'Finish creating your account' }) }
}

export function signupAttemptMail(to: string, signInLink: string, resetLink: string): OutgoingMail {
  const lines = [
    'Someone tried to open a new Knotwork account with this e-mail address. It already belongs to your account, so no new account was made.',
    'If it was you, sign in instead; if you have forgotten your password, you can set a new one from the sign-in page. If it was not you, nothing has changed and you need not do anything.',
  ]
  return { to, subject: 'Someone tried to sign up with your address', text: `${lines.join('\n\n')}\n\nSign in: ${signInLink}\nSet a new password: ${resetLink}\n`, html: html(lines, { href: signInLink, label: 'Sign in' }) }
}
