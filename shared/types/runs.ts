// A long run (a comparison, reading an upload, a signed export) as any app node reports it: kept in PostgreSQL while it runs and for an
// hour after it ends. `id` is the run id the page chose (or the server, when the page gave none).
export type RunKind = 'compare' | 'import-read' | 'export'
export type RunStatus = 'queued' | 'running' | 'done' | 'failed' | 'cancelled'

export interface RunDto {
  id: string
  kind: RunKind
  status: RunStatus
  /** steps done so far, of how many (methods filled, for a comparison) */
  done: number
  total: number
  /** how many times a node started it (more than 1: a node stopped and another took it over) */
  attempts: number
  createdAt: string
  startedAt: string | null
  finishedAt: string | null
  error: { code: string, message: string } | null
}
