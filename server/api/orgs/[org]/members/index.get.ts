import type { MemberDto } from '#shared/types/api'
import { listMembers } from '~~/server/services/members'

export default defineEventHandler(async (event): Promise<MemberDto[]> => {
  const { org } = await requirePermission(event, 'members:manage')
  return listMembers(org.id)
})
