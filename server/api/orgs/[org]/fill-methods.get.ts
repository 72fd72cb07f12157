import { fillMethods } from '~~/server/services/fills'

// The engine's methods, options and transforms, for the fill bench's pickers.
export default defineEventHandler(async (event) => {
  await requirePermission(event, 'tables:read')
  return fillMethods()
})
