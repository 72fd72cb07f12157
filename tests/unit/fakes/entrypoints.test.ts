import { spawn, type ChildProcess } from 'node:child_process'
import { mkdtempSync, readFileSync, existsSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join, resolve } from 'node:path'
import nodemailer from 'nodemailer'
import { afterAll, describe, expect, it } from 'vitest'
import { client } from './helpers.ts'

const root = resolve(import.meta.dirname, '../../..')
const tmp = mkdtempSync(join(tmpdir(), 'kw-fakes-'))
const children: ChildProcess[] = []
afterAll(() => { for (const c of children) c.kill('SIGTERM'); rmSync(tmp, { recursive: true, force: true }) })

/** Runs a fake's server.ts as the scripts do (`node --import tsx`) and waits for its port file. */
async function run(name: 'stripe' | 'smtp', env: Record<string, string>): Promise<{ child: ChildProcess; ports: string }> {
  const portFile = join(tmp, `${name}.${children.length}.port`)
  const child = spawn(process.execPath, ['--import', 'tsx', `fakes/${name}/server.ts`], {
    cwd: root, env: { ...process.env, ...env, [`FAKE_${name.toUpperCase()}_PORT_FILE`]: portFile }, stdio: 'ignore',
  })
  children.push(child)
  for (let i = 0; i < 200 && !existsSync(portFile); i++) await new Promise((r) => setTimeout(r, 50))
  return { child, ports: readFileSync(portFile, 'utf8').trim() }
}

async function stop(child: ChildProcess): Promise<void> {
  await new Promise((r) => { child.once('exit', r); child.kill('SIGTERM') })
}

describe('server entry points', () => {
  it('fake Stripe answers /_health and keeps its state in FAKE_STRIPE_STATE across a restart', async () => {
    const state = join(tmp, 'stripe-state.json')
    const first = await run('stripe', { FAKE_STRIPE_STATE: state, FAKE_STRIPE_PORT: '0' })
    const port = Number(first.ports)
    expect((await fetch(`http://127.0.0.1:${port}/_health`)).status).toBe(200)
    const customer = await client(port).customers.create({ email: 'restart@larkspur.example' })
    await stop(first.child)
    const second = await run('stripe', { FAKE_STRIPE_STATE: state, FAKE_STRIPE_PORT: '0' })
    expect((await client(Number(second.ports)).customers.retrieve(customer.id)).id).toBe(customer.id)
  })

  it('fake SMTP writes its ports and keeps messages in FAKE_SMTP_STORE across a restart', async () => {
    const store = join(tmp, 'mail.jsonl')
    const first = await run('smtp', { FAKE_SMTP_STORE: store })
    const ports = JSON.parse(first.ports) as { smtp: number; http: number }
    await nodemailer.createTransport({ host: '127.0.0.1', port: ports.smtp, secure: false, ignoreTLS: true })
      .sendMail({ from: 'a@knotwork.example', to: 'b@larkspur.example', subject: 'Kept', text: 'kept' })
    await stop(first.child)
    const second = JSON.parse((await run('smtp', { FAKE_SMTP_STORE: store })).ports) as { http: number }
    const list = await (await fetch(`http://127.0.0.1:${second.http}/messages`)).json() as Array<{ subject: string }>
    expect(list.map((m) => m.subject)).toEqual(['Kept'])
  })
})
