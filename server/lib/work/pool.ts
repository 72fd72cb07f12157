import { existsSync } from 'node:fs'
import { availableParallelism } from 'node:os'
import path from 'node:path'
import { fileURLToPath } from 'node:url'
import { MessageChannel } from 'node:worker_threads'
import { Piscina } from 'piscina'
import { fromRefusal, type TaskOutcome } from './refusal'
import type { TaskInput, TaskName, TaskOutput } from './tasks/index'

// The worker pool of this process: the engine, import parsing and export building run here, never on the request loop.
// One thread per CPU (KW_WORKER_THREADS overrides), niced so the request loop wins the CPU when both want it.
export const WORKER_FILE = 'knotwork-worker.mjs'

/** How much lower the worker threads' CPU priority is than the request loop's (Linux nice, 0 to 19; KW_WORKER_NICE). */
export function workerNice(): number {
  const wanted = Number(process.env.KW_WORKER_NICE)
  return Number.isInteger(wanted) && wanted >= 0 && wanted <= 19 ? wanted : 10
}

export function poolSize(): number {
  const wanted = Number(process.env.KW_WORKER_THREADS)
  return Number.isInteger(wanted) && wanted > 0 ? wanted : Math.max(1, availableParallelism())
}

/**
 * The bundled worker: KW_WORKER_FILE, else the nearest `workers/knotwork-worker.mjs` above this module. In the built
 * server this module is a chunk under .output/server/ and the bundle is .output/server/workers/ (written by the build
 * hook in nuxt.config.ts); in `nuxt dev` it is .nuxt/workers/.
 */
export function workerFile(): string {
  if (process.env.KW_WORKER_FILE) return path.resolve(process.env.KW_WORKER_FILE)
  for (let dir = path.dirname(fileURLToPath(import.meta.url)); ; dir = path.dirname(dir)) {
    const candidate = path.join(dir, 'workers', WORKER_FILE)
    if (existsSync(candidate)) return candidate
    if (path.dirname(dir) === dir) break
  }
  throw new Error(`The worker bundle (workers/${WORKER_FILE}) was not found: build the server (nuxt build) or set KW_WORKER_FILE.`)
}

let pool: Piscina | undefined

function usePool(): Piscina {
  if (!pool) {
    const size = poolSize()
    pool = new Piscina({ filename: workerFile(), minThreads: size, maxThreads: size, idleTimeout: 5 * 60_000, niceIncrement: workerNice() })
  }
  return pool
}

export interface RunOptions {
  /** Aborting it stops the task: removed from the queue, or its thread is terminated mid-computation. */
  signal?: AbortSignal
  onProgress?: (done: number, total: number) => void
}

/** Runs a task in the pool; refusals come back as the engine's or the import's own error classes. */
export async function runTask<K extends TaskName>(task: K, input: TaskInput<K>, options: RunOptions = {}): Promise<TaskOutput<K>> {
  const channel = options.onProgress ? new MessageChannel() : null
  if (channel) {
    channel.port1.on('message', (m: { done: number, total: number }) => options.onProgress!(m.done, m.total))
    channel.port1.unref()
  }
  active += 1
  try {
    const outcome = await usePool().run(
      { task, input, progress: channel?.port2 },
      { signal: options.signal ?? null, transferList: channel ? [channel.port2] : [] },
    ) as TaskOutcome<TaskOutput<K>>
    if (!outcome.ok) throw fromRefusal(outcome.refusal)
    return outcome.value
  }
  finally {
    active -= 1
    channel?.port1.close()
  }
}

let active = 0
/** Tasks of this process running or waiting in the pool. */
export function poolActive(): number {
  return active
}

export async function closePool(): Promise<void> {
  const p = pool
  pool = undefined
  await p?.destroy()
}
