import { z } from 'zod'

// Route parameters, declared once for every handler. Ids are checked for shape here (a malformed one never reaches a
// PostgreSQL cast); whether the object exists in the caller's organisation is the services' lookup (404 either way).

/** A well-formed UUID (8-4-4-4-12 hex digits). Anything else is answered as "no such object" before it reaches the database. */
export const UUID_PATTERN = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i
export const isUuid = (value: unknown): value is string => typeof value === 'string' && UUID_PATTERN.test(value)

/** An object id in a path: at most 64 characters; the lookup answers 404 for anything that is not one of ours. */
const objectId = z.string().max(64)
const versionNumber = z.coerce.number().int().min(1).max(1_000_000)

export const tableParamsSchema = z.object({ table: objectId })
export const versionParamsSchema = z.object({ table: objectId, version: versionNumber })
export const importParamsSchema = z.object({ import: objectId })
export const invitationParamsSchema = z.object({ invitation: objectId })
export const memberParamsSchema = z.object({ user: z.uuid({ message: 'No such member.' }) })
export const readTokenParamsSchema = z.object({ token: z.uuid({ message: 'Not a read token id' }) })
export const runParamsSchema = z.object({ run: z.string().regex(/^[A-Za-z0-9-]{8,64}$/, { message: 'Not a run id' }) })
