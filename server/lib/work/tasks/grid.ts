import { compareSelect, fillSelect } from '~~/server/engine/index'
import type { AxisMethod, SelectCompareResult, SelectFillRequest, SelectFillResult } from '~~/server/engine/types'
import type { TaskContext } from './context'

// Two-way fills (issue 17) in a worker thread: the comparison of choices and the chosen fill, pure engine calls.

export interface GridCompareTaskInput { request: Omit<SelectFillRequest, 'method'>, choices: { x: AxisMethod, d: AxisMethod, label?: string }[] }

export function gridCompareTask(input: GridCompareTaskInput, ctx: TaskContext): SelectCompareResult {
  return compareSelect(input.request, input.choices, done => ctx.progress(done, input.choices.length))
}

export function gridFillTask(request: SelectFillRequest): SelectFillResult {
  return fillSelect(request)
}
