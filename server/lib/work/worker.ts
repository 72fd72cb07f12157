import type { MessagePort } from 'node:worker_threads'
import { TASKS, type TaskName } from './tasks/index'
import { toRefusal, type TaskOutcome } from './refusal'

// The worker threads' entry (piscina calls the default export once per task). Bundled on its own by esbuild at build
// time (scripts/build-worker.ts): .output/server/workers/knotwork-worker.mjs beside the Nitro server.
export interface TaskMessage { task: TaskName, input: unknown, progress?: MessagePort }

export default async function runTask({ task, input, progress }: TaskMessage): Promise<TaskOutcome<unknown>> {
  const run = TASKS[task] as (input: unknown, ctx: { progress: (done: number, total: number) => void }) => unknown
  if (!run) throw new Error(`unknown task '${task}'`)
  try {
    return { ok: true, value: await run(input, { progress: (done, total) => progress?.postMessage({ done, total }) }) }
  }
  catch (error) {
    const refusal = toRefusal(error)
    if (refusal) return { ok: false, refusal }
    throw error
  }
  finally {
    progress?.close()
  }
}
