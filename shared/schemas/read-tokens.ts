import { z } from 'zod'

export const readTokenCreateSchema = z.object({
  name: z.string().trim().min(1, { message: 'Name the token after the system that will use it' }).max(80, { message: 'Use at most 80 characters' }),
})
export type ReadTokenCreateInput = z.infer<typeof readTokenCreateSchema>
