import { randomBytes } from 'node:crypto'
import { hostname } from 'node:os'
import { poolSize } from '../../lib/work/pool'

const seconds = (name: string, fallback: number) => {
  const v = Number(process.env[name])
  return Number.isFinite(v) && v > 0 ? v : fallback
}

/**
 * How this node takes part in the runs (see README "Several app nodes"). Every node runs queued work unless
 * KW_RUN_JOBS=0; each leaves one worker thread for interactive work (fills, previews, exports, light comparisons).
 */
export const WORK = {
  /** this process among the nodes: host, pid and a random suffix (a restarted process is a new node) */
  nodeId: `${hostname()}:${process.pid}:${randomBytes(3).toString('hex')}`,
  runJobs: process.env.KW_RUN_JOBS !== '0',
  /** heavy runs this node takes from the queue at once */
  slots: Math.max(1, poolSize() - 1),
  /** heavy runs one organisation may have running at once, over all nodes */
  orgLimit: Math.max(1, Math.floor(seconds('KW_ORG_RUN_LIMIT', 2))),
  heartbeatMs: seconds('KW_RUN_HEARTBEAT_SECONDS', 2) * 1000,
  /** a running run whose node has not written its heartbeat for this long is taken over by another node */
  staleSeconds: seconds('KW_RUN_STALE_SECONDS', 15),
  sweepMs: seconds('KW_RUN_SWEEP_SECONDS', 5) * 1000,
  /** a run that lost its node this many times fails instead of starting again */
  maxAttempts: 3,
  /** finished runs (and their results) are kept this long for whoever follows them */
  keepMinutes: 60,
  /** the queue is polled this often when idle (a node that queues a run wakes its own worker at once) */
  pollSeconds: 1,
} as const
