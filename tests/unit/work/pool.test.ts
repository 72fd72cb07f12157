// The worker pool against the real worker bundle, built here exactly as the build hook builds it for .output
// (scripts/build-worker.ts): results equal the engine run in this thread, refusals keep their class, progress arrives,
// and aborting a running task ends it in its thread at once.
import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import path from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { buildWorker } from '~~/scripts/build-worker'
import { compare, fill } from '~~/server/engine/index'
import { EngineError } from '~~/server/engine/errors'
import type { FillRequest, MethodSpec } from '~~/server/engine/types'
import { ImportRefused } from '~~/server/lib/import/limits'
import { closePool, poolSize, runTask } from '~~/server/lib/work/pool'
import { chunkPoints } from '~~/server/lib/work/point-chunks'

const dir = mkdtempSync(path.join(tmpdir(), 'kw-worker-'))
beforeAll(async () => {
  process.env.KW_WORKER_FILE = await buildWorker(dir)
  process.env.KW_WORKER_NICE = '0'
  process.env.KW_WORKER_THREADS = '1' // one thread: an abort that did not end the work would hold up the next task
}, 120_000)
afterAll(async () => {
  await closePool()
  rmSync(dir, { recursive: true, force: true })
})

// invented demo-like points (q_x rising with age), not a published table: only the equality with the in-thread engine matters
const knots = [55, 60, 65, 70, 75, 80, 85, 90, 95, 100, 105, 110].map((x, i) => ({ x: String(x), y: (0.004 * 1.45 ** i).toFixed(8) }))
const request = (step: string, transform: FillRequest['transform'] = 'none'): FillRequest => ({ knots, kind: 'mortality', method: 'linear', options: {}, transform, extrapolation: 'error', grid: { from: '55', to: '110', step } })
const methods: MethodSpec[] = [{ method: 'linear' }, { method: 'cubic-natural' }, { method: 'pchip' }]

describe('the worker pool', () => {
  it('has one thread per CPU unless told otherwise', () => {
    delete process.env.KW_WORKER_THREADS
    expect(poolSize()).toBeGreaterThanOrEqual(1)
    process.env.KW_WORKER_THREADS = '3'
    expect(poolSize()).toBe(3)
    process.env.KW_WORKER_THREADS = '1'
  })

  it('compares in a worker thread exactly as the engine does in this one, reporting each method', async () => {
    const seen: number[] = []
    const out = await runTask('compare', { request: request('0.5'), methods, options: {} }, { onProgress: done => seen.push(done) })
    expect(JSON.parse(out.json)).toEqual(compare(request('0.5'), methods))
    expect(seen).toEqual([0, 1, 2, 3])
    expect(out.engineMs).toBeGreaterThan(0)
  })

  it('returns a fill with its values joined for the INSERT', async () => {
    const out = await runTask('fill', { ...request('1'), method: 'cubic-natural' })
    expect(out.pointCount).toBe(56)
    expect(out.chunks).toEqual(chunkPoints(fill({ ...request('1'), method: 'cubic-natural' }).points))
  })

  it('throws the engine\'s and the import\'s refusals with their class, code and point', async () => {
    const bad = { ...request('1'), knots: [{ x: '55', y: '0.01' }, { x: '55', y: '0.02' }], method: 'linear' as const }
    const engine = await runTask('fill', bad).catch(e => e)
    expect(engine).toBeInstanceOf(EngineError)
    expect(engine).toMatchObject({ code: 'duplicate-x' })
    const upload = await runTask('readUpload', { fileName: 'old.xls', data: new Uint8Array([1, 2, 3]) }).catch(e => e)
    expect(upload).toBeInstanceOf(ImportRefused)
    expect(upload).toMatchObject({ statusCode: 415 })
  })

  it('stops a running task when it is aborted (its thread is ended), and goes on serving', async () => {
    const controller = new AbortController()
    let started = 0
    // a fine grid on ln q: tens of seconds of work in the pool's only thread
    const running = runTask('compare', { request: request('0.001', 'log'), methods: [{ method: 'cubic-natural' }, { method: 'pchip' }, { method: 'akima' }], options: {} }, { signal: controller.signal, onProgress: () => { started = Date.now() } })
    while (!started) await new Promise(resolve => setTimeout(resolve, 10))
    controller.abort()
    const aborted = Date.now()
    await expect(running).rejects.toMatchObject({ name: 'AbortError' })
    const after = await runTask('compare', { request: request('5'), methods, options: {} })
    expect(JSON.parse(after.json).entries).toHaveLength(3)
    // the same thread (or its replacement) was free at once, not after the long comparison ran to its end
    expect(Date.now() - aborted).toBeLessThan(8000)
  })
})

describe('point chunks', () => {
  it('joins x and y in chunks of at most 10,000 points, in order', () => {
    const points = Array.from({ length: 25_001 }, (_, i) => ({ x: String(i), y: `0.${i}` }))
    const chunks = chunkPoints(points)
    expect(chunks.map(c => c.count)).toEqual([10_000, 10_000, 5_001])
    expect(chunks.flatMap(c => c.xs.split(','))).toEqual(points.map(p => p.x))
    expect(chunks[2]!.ys.split(',')[0]).toBe('0.20000')
  })
})
