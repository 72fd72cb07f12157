import type { H3Event } from 'h3'
import { Op } from 'sequelize'
import { can, type Permission, type Role } from '#shared/permissions'
import { Membership, Organisation, SessionRecord, User } from '../database/models'

export interface AuthUser { id: string; email: string; name: string }
export interface OrgAccess { user: AuthUser; org: Organisation; role: Role; sessionId: string }

const SESSION_HOURS = 12

/** Opens a fresh server-side session and seals its id into a new cookie. */
export async function startSession(event: H3Event, user: User): Promise<void> {
  const record = await SessionRecord.create({
    userId: user.id,
    expiresAt: new Date(Date.now() + SESSION_HOURS * 3600_000),
    revokedAt: null,
    revokedReason: null,
    ip: clientAddress(event),
    userAgent: getRequestHeader(event, 'user-agent')?.slice(0, 300) ?? null,
  })
  await writeSession(event, { user: { id: user.id, email: user.email, name: user.name }, sid: record.id })
  event.context.auth = { user: { id: user.id, email: user.email, name: user.name }, sessionId: record.id }
}

/** Ends every live session of a person (or all but one), effective on their next request. */
export async function revokeSessions(userId: string, reason: string, exceptId?: string) {
  await SessionRecord.update({ revokedAt: new Date(), revokedReason: reason }, {
    where: { userId, revokedAt: null, ...(exceptId ? { id: { [Op.ne]: exceptId } } : {}) },
  })
}

export async function revokeSession(sessionId: string, reason: string) {
  await SessionRecord.update({ revokedAt: new Date(), revokedReason: reason }, { where: { id: sessionId, revokedAt: null } })
}

/** 401 unless the sealed cookie names a live, unrevoked session record. Checked on every request. */
export async function requireUser(event: H3Event): Promise<{ user: AuthUser; sessionId: string }> {
  if (event.context.auth) return event.context.auth
  const session = await readSession(event)
  const sid = session?.sid
  if (!session?.user || !sid) throw apiError(401, 'sign-in-required', 'Sign in to continue.')
  const record = await SessionRecord.findByPk(sid)
  // the dead cookie is left alone: a refusal never sets a cookie, and the next sign-in replaces it
  if (!record || record.revokedAt || record.expiresAt.getTime() < Date.now() || record.userId !== session.user.id) {
    throw apiError(401, 'session-ended', 'Your session has ended. Sign in again.')
  }
  if (Date.now() - record.lastSeenAt.getTime() > 60_000) await record.update({ lastSeenAt: new Date() })
  const user = await User.findByPk(record.userId)
  if (!user) throw apiError(401, 'sign-in-required', 'Sign in to continue.')
  const auth = { user: { id: user.id, email: user.email, name: user.name }, sessionId: sid }
  event.context.auth = auth
  return auth
}

/** The caller's membership of the organisation in the route; 404 when they have none. */
export async function requireMember(event: H3Event, slug = getRouterParam(event, 'org')): Promise<OrgAccess> {
  const { user, sessionId } = await requireUser(event)
  const cached = event.context.access
  if (cached && cached.org.slug === slug) return cached
  const org = slug ? await Organisation.findOne({ where: { slug } }) : null
  const membership = org ? await Membership.findOne({ where: { orgId: org.id, userId: user.id } }) : null
  if (!org || !membership) throw apiError(404, 'not-found', 'No such organisation.')
  const access: OrgAccess = { user, org, role: membership.role, sessionId }
  event.context.access = access
  return access
}

/** 401 anonymous, 404 not a member, 403 when the role lacks the permission (shared/permissions.ts). */
export async function requirePermission(event: H3Event, permission: Permission): Promise<OrgAccess> {
  const access = await requireMember(event)
  if (!can(access.role, permission)) {
    throw apiError(403, 'role-forbidden', `Your role (${access.role}) does not allow this.`)
  }
  return access
}

/** Same 404 for a missing object and another organisation's object. */
export function notFound(what: string): never {
  throw apiError(404, 'not-found', `No such ${what}.`)
}
