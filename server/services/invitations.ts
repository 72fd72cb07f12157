import { isUuid } from '#shared/schemas/route-params'
import type { H3Event } from 'h3'
import { Op, type Transaction } from 'sequelize'
import type { Role } from '#shared/permissions'
import type { InvitationDto, InvitationPreviewDto } from '#shared/types/api'
import { Invitation, Membership, Organisation, User } from '../database/models'
import { hashToken, looksLikeToken, newToken } from '../lib/tokens'
import type { OrgAccess } from '../utils/auth'
import { provisionBilling } from './billing'
import { invitationMail } from './mail-templates'
import { ensureBillingAccount, seatUsage } from './seats'

export const INVITATION_DAYS = 7

const open = { acceptedAt: null, cancelledAt: null }

export function toInvitationDto(i: Invitation, inviter?: string | null): InvitationDto {
  return { id: i.id, email: i.email, role: i.role, invitedBy: inviter ?? null, sentAt: i.sentAt.toISOString(), expiresAt: i.expiresAt.toISOString(), expired: i.expiresAt.getTime() <= Date.now() }
}

export async function listInvitations(orgId: string): Promise<InvitationDto[]> {
  const rows = await Invitation.findAll({ where: { orgId, ...open }, order: [['sentAt', 'DESC']] })
  const names = new Map((await User.findAll({ where: { id: rows.map(r => r.invitedBy).filter((v): v is string => !!v) } })).map(u => [u.id, u.name]))
  return rows.map(r => toInvitationDto(r, r.invitedBy ? names.get(r.invitedBy) : null))
}

/** Sends (or re-sends) the link with a fresh token; inside the transaction, so a failed send changes nothing. */
async function sendInvitation(access: OrgAccess, invitation: Invitation, t: Transaction): Promise<void> {
  const { token, hash } = newToken()
  const expiresAt = new Date(Date.now() + INVITATION_DAYS * 86400_000)
  await invitation.update({ tokenHash: hash, expiresAt, sentAt: new Date() }, { transaction: t })
  try {
    await sendMail(invitationMail(invitation.email, access.org.name, access.user.name, invitation.role, appLink(`/invitations/${token}`), expiresAt))
  } catch {
    throw apiError(502, 'mail-failed', 'The invitation e-mail could not be sent. Nothing was saved; try again in a minute.')
  }
}

/** Invites an address with a role, if a seat is free (members + open invitations < purchased seats). */
export async function createInvitation(event: H3Event, access: OrgAccess, email: string, role: Role): Promise<InvitationDto> {
  const { org } = access
  const existing = await User.findOne({ where: { email } })
  if (existing && await Membership.findOne({ where: { orgId: org.id, userId: existing.id } })) {
    throw apiError(409, 'already-member', `${email} is already a member of ${org.name}.`)
  }
  await provisionBilling(event, org)
  return inTransaction(async (t) => {
    const account = await ensureBillingAccount(org.id, t, true)
    const previous = await Invitation.findOne({ where: { orgId: org.id, email, ...open }, transaction: t, lock: t.LOCK.UPDATE })
    if (previous && previous.expiresAt.getTime() > Date.now()) {
      throw apiError(409, 'invitation-open', `${email} already has an open invitation. Resend it from the list below.`)
    }
    if (previous) await previous.update({ cancelledAt: new Date() }, { transaction: t })
    const usage = await seatUsage(org.id, account.seats, t)
    if (usage.used >= usage.purchased) {
      throw apiError(409, 'seats-full',
        `All ${usage.purchased} seats are in use (${usage.members} members, ${usage.pending} open invitations). Add seats on the billing page to invite more people.`,
        { billing: `/orgs/${org.slug}/billing`, seats: usage })
    }
    const invitation = await Invitation.create({ orgId: org.id, email, role, tokenHash: newToken().hash, invitedBy: access.user.id, expiresAt: new Date() }, { transaction: t })
    await sendInvitation(access, invitation, t)
    await audit(event, { orgId: org.id, action: 'invitation.create', objectType: 'invitation', objectId: invitation.id, detail: { email, role, seatsUsed: usage.used + 1, seats: usage.purchased } }, t)
    return toInvitationDto(invitation, access.user.name)
  })
}

async function openInvitation(orgId: string, id: string, t: Transaction): Promise<Invitation> {
  const invitation = isUuid(id) ? await Invitation.findOne({ where: { id, orgId, ...open }, transaction: t, lock: t.LOCK.UPDATE }) : null
  if (!invitation) notFound('open invitation')
  return invitation
}

/** A new link (the old one stops working) and a new expiry. An expired invitation needs a free seat again. */
export async function resendInvitation(event: H3Event, access: OrgAccess, id: string): Promise<InvitationDto> {
  return inTransaction(async (t) => {
    const account = await ensureBillingAccount(access.org.id, t, true)
    const invitation = await openInvitation(access.org.id, id, t)
    if (invitation.expiresAt.getTime() <= Date.now()) {
      const usage = await seatUsage(access.org.id, account.seats, t)
      if (usage.used >= usage.purchased) throw apiError(409, 'seats-full', 'This invitation has expired and every seat is taken. Add seats on the billing page first.', { billing: `/orgs/${access.org.slug}/billing` })
    }
    await sendInvitation(access, invitation, t)
    await audit(event, { orgId: access.org.id, action: 'invitation.resend', objectType: 'invitation', objectId: invitation.id, detail: { email: invitation.email } }, t)
    return toInvitationDto(invitation, access.user.name)
  })
}

export async function cancelInvitation(event: H3Event, access: OrgAccess, id: string): Promise<void> {
  await inTransaction(async (t) => {
    const invitation = await openInvitation(access.org.id, id, t)
    await invitation.update({ cancelledAt: new Date() }, { transaction: t })
    await audit(event, { orgId: access.org.id, action: 'invitation.cancel', objectType: 'invitation', objectId: invitation.id, detail: { email: invitation.email, role: invitation.role } }, t)
  })
}

const GONE = 'This invitation link is not valid any more: it was used, cancelled or replaced, or it expired. Ask your administrator for a new one.'

/** The open, unexpired invitation a token names (404 with one message for every other case). */
export async function invitationByToken(token: unknown, t?: Transaction): Promise<Invitation> {
  const found = looksLikeToken(token)
    ? await Invitation.findOne({ where: { tokenHash: hashToken(token), ...open, expiresAt: { [Op.gt]: new Date() } }, transaction: t, ...(t ? { lock: t.LOCK.UPDATE } : {}) })
    : null
  if (!found) throw apiError(404, 'not-found', GONE)
  return found
}

export async function previewInvitation(token: unknown, signedInAs: string | null): Promise<InvitationPreviewDto> {
  const invitation = await invitationByToken(token)
  const org = (await Organisation.findByPk(invitation.orgId))!
  const hasAccount = !!(await User.findOne({ where: { email: invitation.email } }))
  return { org: { name: org.name, slug: org.slug }, email: invitation.email, role: invitation.role, expiresAt: invitation.expiresAt.toISOString(), hasAccount, signedInAs }
}
