import type { Server } from 'node:http'
import type { AddressInfo } from 'node:net'
import type { SMTPServer } from 'smtp-server'
import { createInboxServer } from './http.ts'
import { Inbox } from './inbox.ts'
import { createSmtpServer } from './smtp.ts'

export interface FakeSmtpOptions { storeFile?: string; log?: (line: string) => void }

export class FakeSmtp {
  readonly inbox: Inbox
  readonly smtp: SMTPServer
  readonly http: Server

  constructor(o: FakeSmtpOptions = {}) {
    this.inbox = new Inbox(o.storeFile)
    this.smtp = createSmtpServer(this.inbox, o.log ?? (() => {}))
    this.http = createInboxServer(this.inbox)
  }

  async listen(smtpPort = 0, httpPort = 0, host = '127.0.0.1'): Promise<{ smtp: number; http: number }> {
    const smtp = await new Promise<number>((resolve, reject) => {
      this.smtp.once('error', reject)
      this.smtp.listen(smtpPort, host, () => resolve((this.smtp.server.address() as AddressInfo).port))
    })
    const http = await new Promise<number>((resolve, reject) => {
      this.http.once('error', reject)
      this.http.listen(httpPort, host, () => resolve((this.http.address() as AddressInfo).port))
    })
    return { smtp, http }
  }

  async close(): Promise<void> {
    await new Promise<void>((r) => this.smtp.close(() => r()))
    await new Promise<void>((r) => this.http.close(() => r()))
    this.http.closeAllConnections?.()
  }
}
