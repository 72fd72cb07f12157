import type { TaskContext } from './context'
import { compareTask, fillTask, graduateTask } from './engine'
import { describeTask, previewTask, readUploadTask, validateTask } from './imports'
import { previewMatrixTask, validateMatrixTask } from './import-matrix'
import { gridCompareTask, gridFillTask } from './grid'
import { buildExportTask, signBodyTask, verifyExportTask } from './signing'

/**
 * Everything the worker threads run: the engine, the import's parse / describe / preview / validate steps, and signing
 * and reading signed workbooks. Each task is a pure function of its input (no database, no framework), so a unit test
 * can call it directly and the pool can run it in any thread.
 */
export const TASKS = {
  compare: compareTask,
  fill: fillTask,
  gridCompare: gridCompareTask,
  gridFill: gridFillTask,
  graduate: graduateTask,
  readUpload: readUploadTask,
  describeImport: describeTask,
  previewImport: previewTask,
  validateImport: validateTask,
  previewMatrix: previewMatrixTask,
  validateMatrix: validateMatrixTask,
  buildExport: buildExportTask,
  signBody: signBodyTask,
  verifyExport: verifyExportTask,
} satisfies Record<string, (input: never, ctx: TaskContext) => unknown>

export type TaskName = keyof typeof TASKS
export type TaskInput<K extends TaskName> = Parameters<(typeof TASKS)[K]>[0]
export type TaskOutput<K extends TaskName> = Awaited<ReturnType<(typeof TASKS)[K]>>
export type { TaskContext }
