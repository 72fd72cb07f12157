import { z } from '#shared/zod'

const name = z.string().trim().min(1, { message: 'Name the token after the system that will use it' }).max(80, { message: 'Use at most 80 characters' })
const PICK_ONE = 'Pick at least one table, or let the token read every table'

/** The API body: without `tables` the token reads every table that has a signed-off version. */
export const readTokenCreateSchema = z.object({
  name,
  tables: z.array(z.string().uuid({ message: 'A table is named by its id' })).min(1, { message: PICK_ONE }).max(200, { message: 'Pick at most 200 tables' }).optional(),
})
export type ReadTokenCreateInput = z.infer<typeof readTokenCreateSchema>

/** The form on the members page: every table, or only the ticked ones. */
export const readTokenFormSchema = z.object({
  name,
  scope: z.enum(['all', 'some']),
  tables: z.array(z.string()),
}).superRefine((v, ctx) => {
  if (v.scope === 'some' && !v.tables.length) ctx.addIssue({ code: 'custom', path: ['tables'], message: PICK_ONE })
})
