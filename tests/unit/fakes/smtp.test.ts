import nodemailer from 'nodemailer'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { FakeSmtp } from '~~/fakes/smtp/app.ts'

let fake: FakeSmtp
let ports: { smtp: number; http: number }
const inbox = () => `http://127.0.0.1:${ports.http}`

beforeAll(async () => { fake = new FakeSmtp(); ports = await fake.listen(0, 0) })
afterAll(async () => fake.close())

describe('SMTP fake', () => {
  it('receives a message sent by nodemailer and lists it over HTTP', async () => {
    const transport = nodemailer.createTransport({ host: '127.0.0.1', port: ports.smtp, secure: false, ignoreTLS: true })
    await transport.sendMail({
      from: 'Knotwork <no-reply@knotwork.example>', to: 'Ada Quill <ada@larkspur.example>', cc: 'review@fenwickrowe.example',
      subject: 'You were invited to Larkspur Mutual', text: 'Accept: http://127.0.0.1:3000/invite/abc123', html: '<p><a href="http://127.0.0.1:3000/invite/abc123">Accept</a></p>',
    })
    const list = (await (await fetch(`${inbox()}/messages`)).json()) as Array<{ id: string; text: string; html: string }>
    expect(list).toHaveLength(1)
    expect(list[0]).toMatchObject({ subject: 'You were invited to Larkspur Mutual', to: ['ada@larkspur.example'], cc: ['review@fenwickrowe.example'] })
    expect(list[0]!.text.trim()).toBe('Accept: http://127.0.0.1:3000/invite/abc123')
    expect(list[0]!.html).toContain('href="http://127.0.0.1:3000/invite/abc123"')

    const one = await (await fetch(`${inbox()}/messages/${list[0]!.id}`)).json()
    expect(one.id).toBe(list[0]!.id)
    expect(((await (await fetch(`${inbox()}/messages?to=review@fenwickrowe.example`)).json()) as unknown[])).toHaveLength(1)
    expect(((await (await fetch(`${inbox()}/messages?to=nobody@larkspur.example`)).json()) as unknown[])).toHaveLength(0)

    const page = await (await fetch(`${inbox()}/?id=${list[0]!.id}`)).text()
    expect(page).toContain('You were invited to Larkspur Mutual')
    expect(page).toContain('<a href="http://127.0.0.1:3000/invite/abc123"')
  })

  it('accepts any AUTH credentials and clears the inbox on DELETE /messages', async () => {
    const transport = nodemailer.createTransport({ host: '127.0.0.1', port: ports.smtp, secure: false, ignoreTLS: true, auth: { user: 'anyone', pass: 'anything' } })
    await transport.sendMail({ from: 'a@knotwork.example', to: 'b@larkspur.example', subject: 'With auth', text: 'x' })
    expect(((await (await fetch(`${inbox()}/messages`)).json()) as Array<{ subject: string }>)[0]!.subject).toBe('With auth')
    expect((await fetch(`${inbox()}/messages`, { method: 'DELETE' })).status).toBe(200)
    expect(await (await fetch(`${inbox()}/messages`)).json()).toEqual([])
  })
})
