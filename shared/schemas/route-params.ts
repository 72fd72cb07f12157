import { z } from '#shared/zod'

// Route parameters: every id in a URL is checked here before it can reach a PostgreSQL ::uuid cast (where anything
// malformed would fail as a 500). A parameter that is not well formed names nothing, so readValidParams answers it as
// 404 with the same words as an id that names nothing.

/** The 8-4-4-4-12 hex form of a uuid (what gen_random_uuid() gives; also what the organisation's objects are keyed by). */
export const UUID_PATTERN = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i
export const isUuid = (value: unknown): value is string => typeof value === 'string' && UUID_PATTERN.test(value)

/** A uuid parameter; `what` names the object in the 404 message ("No such table."). */
export const idParam = (what: string) => z.string().regex(UUID_PATTERN, { message: `No such ${what}.` })
/** A version number in a URL: 1..1,000,000 (table_versions.number is an integer). */
export const versionNumberParam = z.coerce.number({ message: 'No such version.' }).int({ message: 'No such version.' })
  .min(1, { message: 'No such version.' }).max(1_000_000, { message: 'No such version.' })

export const tableParamsSchema = z.object({ table: idParam('table') })
export const versionParamsSchema = z.object({ table: idParam('table'), version: versionNumberParam })
export const importParamsSchema = z.object({ import: idParam('upload') })
export const invitationParamsSchema = z.object({ invitation: idParam('invitation') })
export const memberParamsSchema = z.object({ user: idParam('member') })
export const readTokenParamsSchema = z.object({ token: idParam('read token') })
export const runParamsSchema = z.object({ run: z.string().regex(/^[A-Za-z0-9-]{8,64}$/, { message: 'No comparison with this run id is in progress.' }) })
