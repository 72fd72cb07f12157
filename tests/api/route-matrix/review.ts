import { ownerDb } from '../helpers'
import { EVERY_MEMBER, PUBLIC, ROLE_ONLY, type MatrixContext, type RouteExpectation } from './types'

// Review, diff, audit trail, signing keys, signed exports (issue 7).
const DECIDERS = ROLE_ONLY(['actuary'])
const SUBMITTERS = ROLE_ONLY(['actuary', 'analyst'])
const EXPORTERS = ROLE_ONLY(['admin', 'actuary', 'auditor'])

const draft = (ctx: MatrixContext) => `/api/orgs/${ctx.org}/tables/${ctx.ids.draftTable}/versions/${ctx.ids.draftNumber}`
/** The demo discount curve's signed-off version (seeded by scripts/seed/approvals.ts). */
async function approved(ctx: MatrixContext): Promise<string> {
  const [rows] = await ownerDb().query(`SELECT v.table_id, v.number FROM table_versions v JOIN organisations o ON o.id = v.org_id
    WHERE o.slug = :slug AND v.status = 'approved' ORDER BY (v.fill_spec IS NOT NULL) DESC, v.number LIMIT 1`, { replacements: { slug: ctx.org } })
  const r = (rows as { table_id: string; number: number }[])[0]!
  return `/api/orgs/${ctx.org}/tables/${r.table_id}/versions/${r.number}`
}

export const reviewRoutes: Record<string, RouteExpectation> = {
  'GET /api/orgs/[org]/reviews': { expect: EVERY_MEMBER },
  'GET /api/orgs/[org]/tables/[table]/versions/[version]/review': { path: draft, expect: EVERY_MEMBER },
  // the draft has no fill: submit answers 409 and changes nothing
  'POST /api/orgs/[org]/tables/[table]/versions/[version]/submit': { csrf: 'json', path: ctx => `${draft(ctx)}/submit`, expect: SUBMITTERS },
  'POST /api/orgs/[org]/tables/[table]/versions/[version]/approve': { csrf: 'json', path: ctx => `${draft(ctx)}/approve`, expect: DECIDERS },
  'POST /api/orgs/[org]/tables/[table]/versions/[version]/send-back': { csrf: 'json', path: ctx => `${draft(ctx)}/send-back`, expect: DECIDERS },
  'POST /api/orgs/[org]/tables/[table]/versions/[version]/retire': { csrf: 'json', path: async ctx => `${await approved(ctx)}/retire`, expect: DECIDERS },
  'POST /api/orgs/[org]/tables/[table]/versions/[version]/comments': { csrf: 'json', path: ctx => `${draft(ctx)}/comments`, expect: SUBMITTERS },
  'GET /api/orgs/[org]/tables/[table]/versions/[version]/export': { path: async ctx => `${await approved(ctx)}/export`, expect: EXPORTERS },
  'GET /api/orgs/[org]/tables/[table]/diff': { path: ctx => `/api/orgs/${ctx.org}/tables/${ctx.ids.draftTable}/diff?a=1&b=${ctx.ids.draftNumber}`, expect: EVERY_MEMBER },
  'GET /api/orgs/[org]/audit': { expect: EVERY_MEMBER },
  'GET /api/orgs/[org]/audit/verify': { expect: EVERY_MEMBER },
  'GET /api/orgs/[org]/signing-keys': { expect: EVERY_MEMBER },
  'POST /api/orgs/[org]/signing-keys/rotate': { csrf: 'json', expect: ROLE_ONLY(['admin']) },
  'POST /api/orgs/[org]/exports/verify': { csrf: 'multipart', expect: EXPORTERS },
  'GET /api/keys/[file]': { path: ctx => `/api/keys/${ctx.org}.json`, expect: PUBLIC },
}
