// What each route accepts as a request body: its byte limit (counted as the bytes arrive, server/middleware/request-body.ts)
// and whether it takes JSON only. Routes that read their own multipart body (busboy, counting bytes against their own,
// larger cap: server/services/upload.ts) are left to that reader. Limits are in docs/reliability.md.
export const KiB = 1024
export const MiB = 1024 * KiB

export const BODY_LIMITS = {
  /** every JSON route and every page unless named below: forms, specs, comments, lists of ids */
  default: 256 * KiB,
  /** PUT .../points and .../cells, POST .../tables/two-way: up to 20,000 points or cells (MAX_POINTS) of 40-digit decimals */
  points: 4 * MiB,
  /** import preview and commit: the mapping and the person's cell fixes */
  importMapping: 1 * MiB,
  /** Stripe's events (JSON, signed on the raw bytes) */
  webhook: 1 * MiB,
} as const

export interface BodyRule {
  /** the largest body in bytes, or null when the route's own reader counts against its own cap */
  limit: number | null
  /** only application/json is accepted (415 otherwise) */
  json: boolean
}

const ORG = '/api/orgs/[^/]+'
const RULES: { method: string; path: RegExp; rule: BodyRule }[] = [
  { method: 'POST', path: new RegExp(`^${ORG}/imports/?$`), rule: { limit: null, json: false } }, // the upload, 20 MiB
  { method: 'POST', path: new RegExp(`^${ORG}/exports/verify/?$`), rule: { limit: null, json: false } }, // a signed workbook, 10 MiB
  { method: 'PUT', path: new RegExp(`^${ORG}/tables/[^/]+/versions/[^/]+/(points|cells)/?$`), rule: { limit: BODY_LIMITS.points, json: true } },
  // a new two-way table with its given cells (up to MAX_POINTS, like PUT .../cells)
  { method: 'POST', path: new RegExp(`^${ORG}/tables/two-way/?$`), rule: { limit: BODY_LIMITS.points, json: true } },
  { method: 'POST', path: new RegExp(`^${ORG}/imports/[^/]+/(preview|commit|matrix-preview|matrix-commit)/?$`), rule: { limit: BODY_LIMITS.importMapping, json: true } },
  { method: 'POST', path: /^\/api\/webhooks\/stripe\/?$/, rule: { limit: BODY_LIMITS.webhook, json: true } },
]

/** The rule for a request; `path` may carry a query string. */
export function bodyRuleFor(method: string, path: string): BodyRule {
  const bare = path.split('?')[0]!
  const found = RULES.find(r => r.method === method.toUpperCase() && r.path.test(bare))
  if (found) return found.rule
  return { limit: BODY_LIMITS.default, json: bare === '/api' || bare.startsWith('/api/') }
}

/** application/json, with or without parameters (charset=utf-8 as Stripe sends it). */
export function isJsonContentType(value: string | undefined): boolean {
  return /^application\/json\s*(;|$)/i.test(value?.trim() ?? '')
}

/** "256 KiB", "4 MiB": a limit as people read it. */
export function formatBytes(bytes: number): string {
  return bytes >= MiB ? `${+(bytes / MiB).toFixed(1)} MiB` : `${+(bytes / KiB).toFixed(1)} KiB`
}
