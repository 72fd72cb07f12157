import { ownerDb } from '../helpers'
import { EVERY_MEMBER, ROLE_ONLY, type Caller, type Expect, type MatrixContext, type RouteExpectation } from './types'

const EDITORS = ROLE_ONLY(['actuary', 'analyst'])
// An upload belongs to the person who made it (the analyst here): another editor gets 404.
const UPLOAD_OWNER: Record<Caller, Expect> = { ...EDITORS, actuary: 404 }

const table = (ctx: MatrixContext) => `/api/orgs/${ctx.org}/tables/${ctx.ids.draftTable}`
const draft = (ctx: MatrixContext) => `${table(ctx)}/versions/${ctx.ids.draftNumber}`

/** A small upload owned by the analyst, inserted behind the app's back for the matrix. */
async function analystImport(ctx: MatrixContext): Promise<string> {
  const [rows] = await ownerDb().query(`
    INSERT INTO imports (org_id, owner_id, file_name, file_kind, size_bytes, sheets, sheet_summary, expires_at)
    VALUES (:org, :owner, 'matrix.csv', 'csv', 20, :sheets::jsonb, :summary::jsonb, now() + interval '1 hour') RETURNING id`,
  { replacements: { org: ctx.ids.org, owner: ctx.ids.analyst, sheets: JSON.stringify([{ name: 'matrix', rows: [['age', 'q'], ['60', '0.01'], ['65', '0.02']], formulas: [], colCount: 2 }]),
    summary: JSON.stringify([{ name: 'matrix', rowCount: 3, colCount: 2, headerGuess: 0 }]) } })
  return `/api/orgs/${ctx.org}/imports/${(rows as { id: string }[])[0]!.id}`
}

export const tablesRoutes: Record<string, RouteExpectation> = {
  'GET /api/orgs/[org]/tables/[table]': { path: table, expect: EVERY_MEMBER },
  'PATCH /api/orgs/[org]/tables/[table]': { csrf: 'json', path: table, body: {}, expect: EDITORS },
  'GET /api/orgs/[org]/tables/[table]/versions': { path: ctx => `${table(ctx)}/versions`, expect: EVERY_MEMBER },
  'POST /api/orgs/[org]/tables/[table]/versions': { csrf: 'json', path: ctx => `${table(ctx)}/versions`, expect: EDITORS },
  'GET /api/orgs/[org]/tables/[table]/versions/[version]': { path: draft, expect: EVERY_MEMBER },
  'PUT /api/orgs/[org]/tables/[table]/versions/[version]/points': { csrf: 'json', path: ctx => `${draft(ctx)}/points`, expect: EDITORS },
  'POST /api/orgs/[org]/imports': { csrf: 'multipart', expect: EDITORS },
  'GET /api/orgs/[org]/imports/[import]': { path: analystImport, expect: UPLOAD_OWNER },
  // the empty body fails validation (400) before the upload is looked up; with a valid mapping another
  // editor gets 404 (tests/api/import.test.ts)
  'POST /api/orgs/[org]/imports/[import]/preview': { csrf: 'json', path: async ctx => `${await analystImport(ctx)}/preview`, expect: EDITORS },
  'POST /api/orgs/[org]/imports/[import]/commit': { csrf: 'json', path: async ctx => `${await analystImport(ctx)}/commit`, expect: EDITORS },
  'DELETE /api/orgs/[org]/imports/[import]': { csrf: 'json', path: analystImport, expect: UPLOAD_OWNER },
}
