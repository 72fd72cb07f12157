import { listMySubmissions } from '~~/server/services/my-work'

// The versions the caller submitted for a second check: awaiting, signed off or sent back.
export default defineEventHandler(async (event) => {
  const access = await requirePermission(event, 'reviews:submit')
  return listMySubmissions(access)
})
