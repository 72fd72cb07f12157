import { simpleParser, type AddressObject } from 'mailparser'
import { SMTPServer } from 'smtp-server'
import type { Inbox } from './inbox.ts'

const MAX_SIZE = 25 * 1024 * 1024

function addresses(v: AddressObject | AddressObject[] | undefined): string[] {
  const list = Array.isArray(v) ? v : v ? [v] : []
  return list.flatMap((a) => a.value.map((x) => (x.address ?? '').toLowerCase())).filter(Boolean)
}

/** SMTP without TLS; any AUTH (or none) is accepted. Each message is parsed and put in the inbox. */
export function createSmtpServer(inbox: Inbox, log: (line: string) => void): SMTPServer {
  return new SMTPServer({
    secure: false, authOptional: true, allowInsecureAuth: true, disabledCommands: ['STARTTLS'],
    size: MAX_SIZE, rejectOversized: true, banner: 'Knotwork local mail fake', logger: false,
    onAuth(_auth, _session, cb) { cb(null, { user: 'local' }) },
    onData(stream, session, cb) {
      simpleParser(stream).then((mail) => {
        const msg = inbox.add({
          from: mail.from?.text ?? (session.envelope.mailFrom ? session.envelope.mailFrom.address : ''),
          to: addresses(mail.to), cc: addresses(mail.cc),
          envelope: {
            from: session.envelope.mailFrom ? session.envelope.mailFrom.address : '',
            to: session.envelope.rcptTo.map((r) => r.address.toLowerCase()),
          },
          subject: mail.subject ?? '', text: mail.text ?? '', html: typeof mail.html === 'string' ? mail.html : null,
          date: (mail.date ?? new Date()).toISOString(), message_id: mail.messageId ?? null,
          attachments: mail.attachments.map((a) => ({ filename: a.filename ?? null, content_type: a.contentType, size: a.size })),
        })
        log(`mail ${msg.id} from ${msg.envelope.from} to ${msg.envelope.to.join(', ')}: ${msg.subject}`)
        cb()
      }, (err: Error) => cb(err))
    },
  })
}
