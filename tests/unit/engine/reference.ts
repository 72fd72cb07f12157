import { spawnSync } from 'node:child_process'
import { readFileSync } from 'node:fs'
import { dirname, resolve } from 'node:path'
import { fileURLToPath } from 'node:url'

const folder = resolve(dirname(fileURLToPath(import.meta.url)), '../../reference')

/**
 * A reference computed by a Python script in tests/reference (which prints JSON), run now when python3 with the script's
 * libraries is on PATH; otherwise the committed copy of its output. Says which in the test log.
 */
export function loadReference<T>(script: string, committed: string, label: string): T {
  const run = spawnSync('python3', [resolve(folder, script)], { encoding: 'utf8', maxBuffer: 64 * 1024 * 1024 })
  if (run.status === 0) {
    console.info(`${label}: computed just now by tests/reference/${script}`)
    return JSON.parse(run.stdout) as T
  }
  console.info(`${label}: committed tests/reference/${committed} (python3 could not run ${script}: ${run.stderr?.split('\n').filter(Boolean).pop() ?? run.error?.message})`)
  return JSON.parse(readFileSync(resolve(folder, committed), 'utf8')) as T
}
