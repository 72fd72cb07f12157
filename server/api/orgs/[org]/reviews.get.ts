import { reviewQueue } from '~~/server/services/review-queries'

// Versions awaiting a second check, oldest first; `yours` marks those the caller may not sign off.
export default defineEventHandler(async (event) => {
  const access = await requirePermission(event, 'tables:read')
  return reviewQueue(access)
})
