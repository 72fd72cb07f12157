import { listReadTokens } from '~~/server/services/read-tokens'

// The organisation's read tokens (names, hints, last use; never the tokens themselves).
export default defineEventHandler(async (event) => {
  const access = await requirePermission(event, 'members:manage')
  return listReadTokens(access.org.id)
})
