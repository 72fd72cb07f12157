import { EVERY_MEMBER, ROLE_ONLY, type MatrixContext, type RouteExpectation } from './types'

const RUNNERS = ROLE_ONLY(['actuary', 'analyst'])
// The demo draft of Larkspur's male pensioner mortality (ids.ts: benchTable, benchNumber).
const draft = (ctx: MatrixContext) => `/api/orgs/${ctx.org}/tables/${ctx.ids.benchTable}/versions/${ctx.ids.benchNumber}`

export const fillsRoutes: Record<string, RouteExpectation> = {
  'GET /api/orgs/[org]/fill-methods': { expect: EVERY_MEMBER },
  'POST /api/orgs/[org]/tables/[table]/versions/[version]/compare': { csrf: 'json', path: ctx => `${draft(ctx)}/compare`, body: {}, expect: RUNNERS },
  'POST /api/orgs/[org]/tables/[table]/versions/[version]/fill': { csrf: 'json', path: ctx => `${draft(ctx)}/fill`, body: {}, expect: RUNNERS },
  // the graduate step: an empty body fails validation (400) after the permission check; nothing is stored by the matrix
  'POST /api/orgs/[org]/tables/[table]/versions/[version]/graduate': { csrf: 'json', path: ctx => `${draft(ctx)}/graduate`, body: {}, expect: RUNNERS },
  'POST /api/orgs/[org]/tables/[table]/versions/[version]/graduated-draft': { csrf: 'json', path: ctx => `${draft(ctx)}/graduated-draft`, body: {}, expect: ROLE_ONLY(['actuary', 'analyst']) },
  'GET /api/orgs/[org]/tables/[table]/versions/[version]/fill': { path: ctx => `${draft(ctx)}/fill`, expect: EVERY_MEMBER },
  // no run with this id: a runner gets past the checks and hears 404 (the run is unknown), others 403
  'GET /api/orgs/[org]/compare-progress/[run]': { path: ({ org }) => `/api/orgs/${org}/compare-progress/no-such-run`, expect: { ...RUNNERS, actuary: 404, analyst: 404 } },
}
