import { z } from '#shared/zod'
import { parseDay } from '../plain-text'

// The audit trail's filters, shared by the list and the CSV download. Days are sent as YYYY-MM-DD (the page reads them
// in the app's own format, "2 Dec 2026"); offset is the reader's time zone in minutes east of UTC, so a day is their day.
const day = z.string().trim().refine(d => /^\d{4}-\d{2}-\d{2}$/.test(d) && parseDay(d) === d, 'That is not a calendar date (write it like 2 Dec 2026)')

export const auditFilterSchema = z.object({
  table: z.string().max(64).optional(),
  person: z.string().max(254).optional(),
  action: z.string().max(64).regex(/^[a-z.-]*$/, 'Pick an action from the list').optional(),
  from: day.optional(),
  to: day.optional(),
  offset: z.coerce.number().int().min(-840).max(840).default(0),
}).refine(f => !f.from || !f.to || f.from <= f.to, { path: ['to'], message: 'The last day comes before the first' })

export const auditPageSchema = auditFilterSchema.and(z.object({
  page: z.coerce.number().int().min(1).max(100_000).default(1),
  pageSize: z.coerce.number().int().min(10).max(200).default(50),
}))

/** Empty filter fields mean "all". */
export function activeFilters<T extends { table?: string; person?: string; action?: string }>(q: T): T {
  return { ...q, table: q.table || undefined, person: q.person || undefined, action: q.action || undefined }
}
