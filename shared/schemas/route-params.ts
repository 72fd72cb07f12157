import { z } from '#shared/zod'

// Route parameters shared by the review, diff and export handlers.
export const versionParamsSchema = z.object({ table: z.string().max(64), version: z.coerce.number().int().min(1).max(1_000_000) })
export const tableParamsSchema = z.object({ table: z.string().max(64) })
