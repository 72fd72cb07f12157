import { z } from 'zod'

// Route parameters shared by the review, diff and export handlers.
export const versionParamsSchema = z.object({ table: z.string().max(64), version: z.coerce.number().int().min(1).max(1_000_000) })
export const tableParamsSchema = z.object({ table: z.string().max(64) })

/** A well-formed UUID (8-4-4-4-12 hex digits). Anything else is answered as "no such object" before it reaches the database. */
export const UUID_PATTERN = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i
export const isUuid = (value: unknown): value is string => typeof value === 'string' && UUID_PATTERN.test(value)
