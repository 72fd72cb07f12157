import { randomUUID } from 'node:crypto'
import type { OrgAccess } from '../../utils/auth'
import { createRun, type NewRun } from './runs'
import { executeRun, wakeWorkers } from './runner'

/** A run id for a request that did not bring one. */
export const newRunKey = (): string => randomUUID()

/** Records a run and starts it: here at once when light, else on the queue for the first node with room. */
export async function startRun(access: OrgAccess, run: NewRun): Promise<{ id: string, runKey: string }> {
  const { id, claimed } = await createRun(access, run)
  if (claimed) void executeRun(claimed)
  else if (run.heavy) wakeWorkers()
  return { id, runKey: run.runKey }
}

/** Work above this many point-fills (grid points x methods, transforms counted 20 times) goes through the queue. */
export const HEAVY_WORK = Number(process.env.KW_HEAVY_RUN_WORK) > 0 ? Number(process.env.KW_HEAVY_RUN_WORK) : 200_000

/** Uploads above this size are read through the queue (any node); smaller ones where they arrive. */
export const HEAVY_UPLOAD_BYTES = Number(process.env.KW_HEAVY_UPLOAD_BYTES) > 0 ? Number(process.env.KW_HEAVY_UPLOAD_BYTES) : 2 * 1024 * 1024

/** Signed exports of versions with more fill values than this are built through the queue. */
export const HEAVY_EXPORT_VALUES = 20_000
