import { EVERY_MEMBER, ROLE_ONLY, type MatrixContext, type RouteExpectation } from './types'

// Issue 11: the audit trail as CSV, unsigned downloads of a version's fill and of a bench comparison, the seat preview.
const RUNNERS = ROLE_ONLY(['actuary', 'analyst'])
const bench = (ctx: MatrixContext) => `/api/orgs/${ctx.org}/tables/${ctx.ids.benchTable}/versions/${ctx.ids.benchNumber}`

export const trustRoutes: Record<string, RouteExpectation> = {
  'GET /api/orgs/[org]/audit/export': { expect: EVERY_MEMBER },
  'GET /api/orgs/[org]/tables/[table]/versions/[version]/download': { path: ctx => `${bench(ctx)}/download?format=csv`, expect: EVERY_MEMBER },
  // an empty body: runners get past the checks and hear 400
  'POST /api/orgs/[org]/tables/[table]/versions/[version]/compare-download': { csrf: 'json', path: ctx => `${bench(ctx)}/compare-download?format=csv`, body: {}, expect: RUNNERS },
}
