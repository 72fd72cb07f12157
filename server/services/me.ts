import type { MeDto } from '#shared/types/api'
import { Membership, Organisation, type User } from '../database/models'

export async function describeMe(user: Pick<User, 'id' | 'email' | 'name'>): Promise<MeDto> {
  const memberships = await Membership.findAll({
    where: { userId: user.id },
    include: [{ model: Organisation, as: 'organisation' }],
  })
  return {
    user: { id: user.id, email: user.email, name: user.name },
    memberships: memberships
      .map(m => ({ org: { id: m.organisation!.id, slug: m.organisation!.slug, name: m.organisation!.name }, role: m.role }))
      .sort((a, b) => a.org.name.localeCompare(b.org.name)),
  }
}
