import { ROLE_ONLY, type MatrixContext, type RouteExpectation } from './types'

// Two-way tables (issue 17). An empty body fails validation (400) after the permission check, which counts as 'pass'.
const EDITORS = ROLE_ONLY(['actuary', 'analyst'])
const draft = (ctx: MatrixContext) => `/api/orgs/${ctx.org}/tables/${ctx.ids.draftTable}/versions/${ctx.ids.draftNumber}`

export const twoWayRoutes: Record<string, RouteExpectation> = {
  'POST /api/orgs/[org]/tables/two-way': { csrf: 'json', path: ctx => `/api/orgs/${ctx.org}/tables/two-way`, body: {}, expect: EDITORS },
  'PUT /api/orgs/[org]/tables/[table]/versions/[version]/cells': { csrf: 'json', path: ctx => `${draft(ctx)}/cells`, body: {}, expect: EDITORS },
}
