import { verifyAudit } from '~~/server/services/audit-trail'

// Walks the organisation's hash chain (and the system chain of sign-ins) and points at the first broken link.
export default defineEventHandler(async (event) => {
  const { org } = await requirePermission(event, 'tables:read')
  return verifyAudit(org.id)
})
