// App nodes of the built server (.output) started as separate processes on the database of the environment
// (scripts/env.sh), for the two-node test (short heartbeat and takeover times) and the load benchmark.
import { spawn, type ChildProcess } from 'node:child_process'
import { createWriteStream } from 'node:fs'
import { createServer } from 'node:net'

export interface AppNode { name: string, url: string, port: number, process: ChildProcess, exited: Promise<number | null> }

/** Quick takeover, for tests: a node quiet for 4 s loses its runs. */
export const QUICK_TAKEOVER = { KW_RUN_HEARTBEAT_SECONDS: '1', KW_RUN_STALE_SECONDS: '4', KW_RUN_SWEEP_SECONDS: '1' }

async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = createServer()
    server.once('error', reject)
    server.listen(0, '127.0.0.1', () => {
      const { port } = server.address() as { port: number }
      server.close(() => resolve(port))
    })
  })
}

export async function startNode(name: string, env: Record<string, string> = {}): Promise<AppNode> {
  const port = await freePort()
  const log = createWriteStream(`.data/node-${name}-${process.pid}.log`)
  const url = `http://127.0.0.1:${port}`
  // each node is opened at its own address here (behind a load balancer all would share one NUXT_PUBLIC_BASE_URL):
  // changes must name that origin (server/middleware/01.same-origin.ts)
  const child = spawn(process.execPath, ['.output/server/index.mjs'], {
    env: { ...process.env, NUXT_PUBLIC_BASE_URL: url, ...env, HOST: '127.0.0.1', PORT: String(port), NITRO_PORT: String(port), NUXT_TRUST_PROXY: '1' },
    stdio: ['ignore', 'pipe', 'pipe'],
  })
  child.stdout!.pipe(log)
  child.stderr!.pipe(log)
  const exited = new Promise<number | null>(resolve => child.once('exit', code => resolve(code)))
  for (let i = 0; i < 240; i++) {
    if (child.exitCode !== null) throw new Error(`node ${name} exited with ${child.exitCode} (see .data/node-${name}-${process.pid}.log)`)
    if (await fetch(`${url}/api/me`).then(r => r.status === 401, () => false)) return { name, url, port, process: child, exited }
    await new Promise(resolve => setTimeout(resolve, 250))
  }
  throw new Error(`node ${name} did not answer within a minute`)
}

export async function stopNode(node: AppNode, signal: NodeJS.Signals = 'SIGTERM'): Promise<void> {
  if (node.process.exitCode !== null || node.process.signalCode !== null) return
  node.process.kill(signal)
  const timer = setTimeout(() => node.process.kill('SIGKILL'), 15_000)
  await node.exited
  clearTimeout(timer)
}
