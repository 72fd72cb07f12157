import { z } from '#shared/zod'

// Forms of the review panel; the server validates exactly these.
export const submitReviewSchema = z.object({ note: z.string().trim().max(4000).optional() })
export const decideSchema = z.object({ comment: z.string().trim().max(4000).optional() })
export const sendBackSchema = z.object({ comment: z.string().trim().min(1, 'Say what needs to change before it can be signed off.').max(4000) })
export const retireSchema = z.object({ reason: z.string().trim().min(1, 'Give a reason for withdrawing this version.').max(1000) })
export const commentSchema = z.object({ body: z.string().trim().min(1, 'Write a comment first.').max(4000) })
export type SubmitReviewInput = z.infer<typeof submitReviewSchema>
