import { appendFileSync, existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs'
import { dirname } from 'node:path'
import { randomUUID } from 'node:crypto'

export interface StoredMessage {
  id: string
  from: string
  to: string[]
  cc: string[]
  envelope: { from: string; to: string[] }
  subject: string
  text: string
  html: string | null
  date: string
  message_id: string | null
  attachments: Array<{ filename: string | null; content_type: string; size: number }>
}

/** Messages in memory, newest last; optionally appended to a JSON-lines file (and read back on start). */
export class Inbox {
  private messages: StoredMessage[] = []

  constructor(private file?: string, private limit = 2000) {
    if (file && existsSync(file)) {
      for (const line of readFileSync(file, 'utf8').split('\n')) {
        if (!line.trim()) continue
        const entry = JSON.parse(line)
        if (entry.cleared) this.messages = []
        else this.messages.push(entry as StoredMessage)
      }
    }
  }

  add(m: Omit<StoredMessage, 'id'>): StoredMessage {
    const msg = { id: randomUUID(), ...m }
    this.messages.push(msg)
    if (this.messages.length > this.limit) this.messages.splice(0, this.messages.length - this.limit)
    if (this.file) { mkdirSync(dirname(this.file), { recursive: true }); appendFileSync(this.file, `${JSON.stringify(msg)}\n`) }
    return msg
  }

  /** Newest first; `to` matches header or envelope recipients, case-insensitive. */
  list(filter: { to?: string; subject?: string } = {}): StoredMessage[] {
    const to = filter.to?.toLowerCase()
    return [...this.messages].reverse().filter((m) => (!to || m.to.includes(to) || m.cc.includes(to) || m.envelope.to.includes(to))
      && (!filter.subject || m.subject.toLowerCase().includes(filter.subject.toLowerCase())))
  }

  get(id: string): StoredMessage | undefined {
    return this.messages.find((m) => m.id === id)
  }

  clear(): void {
    this.messages = []
    if (this.file) writeFileSync(this.file, `${JSON.stringify({ cleared: true })}\n`)
  }
}
