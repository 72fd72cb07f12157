import type { MemberDto } from '#shared/types/api'
import { Membership, User } from '~~/server/database/models'

export default defineEventHandler(async (event): Promise<MemberDto[]> => {
  const { org } = await requirePermission(event, 'members:manage')
  const rows = await Membership.findAll({ where: { orgId: org.id }, include: [{ model: User, as: 'user' }] })
  return rows
    .map(m => ({ userId: m.userId, name: m.user!.name, email: m.user!.email, role: m.role, joinedAt: m.createdAt.toISOString() }))
    .sort((a, b) => a.name.localeCompare(b.name))
})
