import { performance } from 'node:perf_hooks'
import { compareAsync, fill, graduate } from '~~/server/engine/index'
import type { CompareOptions } from '~~/server/engine/compare'
import type { Diagnostics, FillRequest, GraduateRequest, GraduateResult, MethodSpec, MoneyImpact, ResolvedSpec } from '~~/server/engine/types'
import { chunkPoints, type PointChunk } from '../point-chunks'
import type { TaskContext } from './context'

export interface CompareTaskInput { request: FillRequest, methods: MethodSpec[], options: CompareOptions }
/** The comparison as JSON text (it can be tens of MB: the request's thread stores and sends it without parsing). */
export interface CompareTaskOutput { json: string, engineMs: number }

/** The engine's compare, reporting each method as it is filled. */
export async function compareTask(input: CompareTaskInput, ctx: TaskContext): Promise<CompareTaskOutput> {
  const started = performance.now()
  ctx.progress(0, input.methods.length)
  const result = await compareAsync(input.request, input.methods, input.options, async (filled, of) => ctx.progress(filled, of))
  const engineMs = performance.now() - started
  return { json: JSON.stringify(result), engineMs }
}

export interface FillTaskOutput { spec: ResolvedSpec, diagnostics: Diagnostics, money: MoneyImpact, pointCount: number, chunks: PointChunk[] }

/** One fill, its values already joined for the INSERT. */
export function fillTask(request: FillRequest): FillTaskOutput {
  const result = fill(request)
  return { spec: result.spec, diagnostics: result.diagnostics, money: result.money, pointCount: result.points.length, chunks: chunkPoints(result.points) }
}

/** Whittaker-Henderson graduation with its fit tests (a banded solve in decimal: tens of ms for 100 ages, more for more). */
export function graduateTask(request: GraduateRequest): GraduateResult {
  return graduate(request)
}
