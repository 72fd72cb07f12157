import { listMyUploads } from '~~/server/services/my-work'

// The caller's own uploads not yet made into tables (kept 24 h): to resume the wizard or discard them.
export default defineEventHandler(async (event) => {
  const access = await requirePermission(event, 'tables:edit')
  return listMyUploads(access)
})
