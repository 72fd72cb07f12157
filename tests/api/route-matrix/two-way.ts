import { ownerDb } from '../helpers'
import { EVERY_MEMBER, ROLE_ONLY, type MatrixContext, type RouteExpectation } from './types'

// Two-way tables (issue 17). An empty body fails validation (400) after the permission check, which counts as 'pass'.
const EDITORS = ROLE_ONLY(['actuary', 'analyst'])
const draft = (ctx: MatrixContext) => `/api/orgs/${ctx.org}/tables/${ctx.ids.draftTable}/versions/${ctx.ids.draftNumber}`

/** A small matrix upload owned by the analyst, inserted behind the app's back for the matrix. */
async function analystMatrix(ctx: MatrixContext): Promise<string> {
  const [rows] = await ownerDb().query(`
    INSERT INTO imports (org_id, owner_id, file_name, file_kind, size_bytes, sheets, sheet_summary, expires_at)
    VALUES (:org, :owner, 'select.csv', 'csv', 30, :sheets::jsonb, :summary::jsonb, now() + interval '1 hour') RETURNING id`,
  { replacements: { org: ctx.ids.org, owner: ctx.ids.analyst, sheets: JSON.stringify([{ name: 'select', rows: [['age', '0', 'Ult'], ['60', '0.01', '0.02']], formulas: [], colCount: 3 }]),
    summary: JSON.stringify([{ name: 'select', rowCount: 2, colCount: 3, headerGuess: 0 }]) } })
  return `/api/orgs/${ctx.org}/imports/${(rows as { id: string }[])[0]!.id}`
}

export const twoWayRoutes: Record<string, RouteExpectation> = {
  'POST /api/orgs/[org]/tables/two-way': { csrf: 'json', path: ctx => `/api/orgs/${ctx.org}/tables/two-way`, body: {}, expect: EDITORS },
  'POST /api/orgs/[org]/imports/[import]/matrix-preview': { csrf: 'json', path: async ctx => `${await analystMatrix(ctx)}/matrix-preview`, body: {}, expect: EDITORS },
  'POST /api/orgs/[org]/imports/[import]/matrix-commit': { csrf: 'json', path: async ctx => `${await analystMatrix(ctx)}/matrix-commit`, body: {}, expect: EDITORS },
  // on the demo's one-way draft a member gets past the checks and hears 409 wrong-shape (or 400 for the empty body)
  'POST /api/orgs/[org]/tables/[table]/versions/[version]/grid-compare': { csrf: 'json', path: ctx => `${draft(ctx)}/grid-compare`, body: {}, expect: EDITORS },
  'POST /api/orgs/[org]/tables/[table]/versions/[version]/grid-fill': { csrf: 'json', path: ctx => `${draft(ctx)}/grid-fill`, body: {}, expect: EDITORS },
  'GET /api/orgs/[org]/tables/[table]/versions/[version]/grid-fill': { path: ctx => `${draft(ctx)}/grid-fill`, expect: EVERY_MEMBER },
  'PUT /api/orgs/[org]/tables/[table]/versions/[version]/cells': { csrf: 'json', path: ctx => `${draft(ctx)}/cells`, body: {}, expect: EDITORS },
}
