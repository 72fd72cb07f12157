import type { H3Event } from 'h3'
import type { Transaction } from 'sequelize'
import type { Role } from '#shared/permissions'
import type { MemberDto } from '#shared/types/api'
import { Membership, User } from '../database/models'
import type { OrgAccess } from '../utils/auth'

/** The target membership, with every admin row of the organisation locked so "last admin" cannot race. */
async function lockedMembership(orgId: string, userId: string, t: Transaction): Promise<{ target: Membership; admins: number }> {
  const admins = await Membership.findAll({ where: { orgId, role: 'admin' }, transaction: t, lock: t.LOCK.UPDATE })
  const target = await Membership.findOne({ where: { orgId, userId }, transaction: t, lock: t.LOCK.UPDATE })
  if (!target) notFound('member')
  return { target, admins: admins.length }
}

function keepOneAdmin(target: Membership, admins: number, what: string) {
  if (target.role === 'admin' && admins <= 1) {
    throw apiError(409, 'last-admin', `${what}: an organisation needs at least one administrator. Make someone else an administrator first.`)
  }
}

export async function changeRole(event: H3Event, access: OrgAccess, userId: string, role: Role): Promise<void> {
  await inTransaction(async (t) => {
    const { target, admins } = await lockedMembership(access.org.id, userId, t)
    if (target.role === role) return
    if (role !== 'admin') keepOneAdmin(target, admins, 'This role cannot change')
    const from = target.role
    await target.update({ role }, { transaction: t })
    await audit(event, { orgId: access.org.id, action: 'member.role-change', objectType: 'user', objectId: userId, detail: { from, to: role } }, t)
  })
}

/**
 * Removes a member. Their access to this organisation ends with the commit, because every request reads the membership
 * (requireMember); their sessions stay, so their work in other organisations goes on undisturbed.
 */
export async function removeMember(event: H3Event, access: OrgAccess, userId: string): Promise<void> {
  await inTransaction(async (t) => {
    const { target, admins } = await lockedMembership(access.org.id, userId, t)
    keepOneAdmin(target, admins, 'This person cannot be removed')
    await target.destroy({ transaction: t })
    await audit(event, { orgId: access.org.id, action: 'member.remove', objectType: 'user', objectId: userId, detail: { role: target.role } }, t)
  })
}

/** The organisation's members, by name. */
export async function listMembers(orgId: string): Promise<MemberDto[]> {
  const rows = await Membership.findAll({ where: { orgId }, include: [{ model: User, as: 'user' }] })
  return rows
    .map(m => ({ userId: m.userId, name: m.user!.name, email: m.user!.email, role: m.role, joinedAt: m.createdAt.toISOString() }))
    .sort((a, b) => a.name.localeCompare(b.name))
}
