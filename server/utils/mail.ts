import nodemailer, { type Transporter } from 'nodemailer'

let transport: Transporter | undefined

/** The SMTP transport, created on first use from NUXT_SMTP_HOST / NUXT_SMTP_PORT (and optional TLS and login). */
function useMailTransport(): Transporter {
  if (transport) return transport
  const config = useRuntimeConfig()
  const host = String(config.smtpHost || '')
  if (!host) throw new Error('No SMTP host configured (NUXT_SMTP_HOST)')
  const user = String(config.smtpUser || '')
  transport = nodemailer.createTransport({
    host,
    port: Number(config.smtpPort || 587),
    secure: !!config.smtpSecure,
    ...(user ? { auth: { user, pass: String(config.smtpPass || '') } } : {}),
    connectionTimeout: 10_000,
  })
  return transport
}

export interface OutgoingMail { to: string; subject: string; text: string; html: string }

export async function sendMail(mail: OutgoingMail): Promise<void> {
  await useMailTransport().sendMail({ from: String(useRuntimeConfig().mailFrom), ...mail })
}

/** An absolute link for an e-mail (NUXT_PUBLIC_BASE_URL). */
export function appLink(path: string): string {
  return `${String(useRuntimeConfig().public.baseUrl).replace(/\/+$/, '')}${path}`
}
