import { isDatabaseUnavailable } from '../lib/database-unavailable'

// Whether PostgreSQL answers, for the page guard (server/middleware/database-pages.ts). A success is trusted for a
// second; concurrent callers share one probe. Kept per process on purpose: it is this node's own view of its database.
const TRUST_MS = 1000
let lastOk = 0
let probing: Promise<boolean> | null = null

async function probe(): Promise<boolean> {
  try {
    await useDb().query('SELECT 1')
    lastOk = Date.now()
    return true
  } catch (error) {
    if (isDatabaseUnavailable(error)) return false
    throw error
  }
}

export function databaseReachable(): Promise<boolean> {
  if (Date.now() - lastOk < TRUST_MS) return Promise.resolve(true)
  probing ??= probe().finally(() => { probing = null })
  return probing
}
