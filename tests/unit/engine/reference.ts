import { spawnSync } from 'node:child_process'
import { mkdtempSync, readFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { dirname, join, resolve } from 'node:path'
import { fileURLToPath } from 'node:url'

const referenceDir = resolve(dirname(fileURLToPath(import.meta.url)), '../../reference')

/**
 * A fixture from a Python reference script in tests/reference: regenerated now when python3 with SciPy and NumPy is on
 * PATH, else the committed copy. `origin` says which (the tests print it).
 */
export function loadReference<T>(script: string, committed: string): { fixture: T, origin: string } {
  const probe = spawnSync('python3', ['-c', 'import scipy, numpy'], { encoding: 'utf8' })
  if (probe.status === 0) {
    const out = join(mkdtempSync(join(tmpdir(), 'knotwork-ref-')), committed)
    const run = spawnSync('python3', [resolve(referenceDir, script), out], { encoding: 'utf8' })
    if (run.status === 0) return { fixture: JSON.parse(readFileSync(out, 'utf8')) as T, origin: `regenerated just now (${run.stdout.trim()})` }
    console.warn(`${script} failed, using the committed fixture: ${run.stderr}`)
  }
  return { fixture: JSON.parse(readFileSync(resolve(referenceDir, committed), 'utf8')) as T, origin: `committed ${committed} (no python3 with SciPy found)` }
}
