import type { Transaction } from 'sequelize'
import type { RunKind } from '#shared/types/runs'
import type { ClaimedRun } from '../runs'
import { executeCompare } from './compare'
import { executeImportRead } from './import-read'
import { executeExport } from './export'

export interface RunContext {
  run: ClaimedRun
  /** aborted when the run is cancelled or another node took it over: the pool stops the task's thread */
  signal: AbortSignal
  progress: (done: number, total: number) => void
}

/** A run's answer: JSON text, or for a file its bytes with {"file": {"name", "type"}} as the text. */
export type RunAnswer = string | { result: string, bytes: Buffer }

/**
 * Does a run's work (in the worker pool) and returns how to commit it: inside the transaction that ends the run, write
 * any effects and return the answer. Runs are taken over after a node stops, so the work itself must change nothing
 * outside that commit.
 */
export type RunExecutor = (ctx: RunContext) => Promise<(t: Transaction) => Promise<RunAnswer>>

export const RUN_KINDS: Record<RunKind, RunExecutor> = {
  'compare': executeCompare,
  'import-read': executeImportRead,
  'export': executeExport,
}
