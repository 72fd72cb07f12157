import type { RouteExpectation } from './types'

// A member asking for a run they never started hears 404, as for anyone else's run; other organisations 404, anonymous 401.
const NO_SUCH_RUN = { anonymous: 401, admin: 404, actuary: 404, analyst: 404, auditor: 404, otherOrg: 404 } as const
const path = ({ org }: { org: string }) => `/api/orgs/${org}/runs/no-such-run`

export const runsRoutes: Record<string, RouteExpectation> = {
  'GET /api/orgs/[org]/runs/[run]': { path, expect: NO_SUCH_RUN },
  'GET /api/orgs/[org]/runs/[run]/result': { path: ctx => `${path(ctx)}/result`, expect: NO_SUCH_RUN },
  'DELETE /api/orgs/[org]/runs/[run]': { csrf: 'json', path, expect: NO_SUCH_RUN },
}
