// Progress of long requests (a comparison of many methods), kept in this process for a minute so the page that started
// one can ask how far it is. Keyed by the person and a run id of the page's choosing; nobody else can read it.
const KEEP_MS = 60_000
const MAX_RUNS = 2000

export interface RunProgress { done: number, total: number, at: number }
const runs = new Map<string, RunProgress>()

const keyOf = (userId: string, runId: string) => `${userId}:${runId}`

export function setProgress(userId: string, runId: string, done: number, total: number): void {
  const now = Date.now()
  if (runs.size >= MAX_RUNS) {
    for (const [k, v] of runs) if (now - v.at > KEEP_MS || runs.size >= MAX_RUNS) runs.delete(k)
  }
  runs.set(keyOf(userId, runId), { done, total, at: now })
}

export function getProgress(userId: string, runId: string): RunProgress | null {
  const p = runs.get(keyOf(userId, runId))
  return p && Date.now() - p.at <= KEEP_MS ? p : null
}

