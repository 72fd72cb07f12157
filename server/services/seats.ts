import { QueryTypes, type Transaction } from 'sequelize'
import type { SeatsDto } from '#shared/types/api'
import { BillingAccount } from '../database/models'
import { NEW_ORG_SEATS } from './billing-plan'

/** The organisation's billing row, created with the starting seats on first need (sign-up does not touch billing). */
export async function ensureBillingAccount(orgId: string, transaction?: Transaction, lock = false): Promise<BillingAccount> {
  const options = { transaction, ...(lock && transaction ? { lock: transaction.LOCK.UPDATE } : {}) }
  const found = await BillingAccount.findByPk(orgId, options)
  if (found) return found
  await useDb().query('INSERT INTO billing_accounts (org_id, seats) VALUES (:orgId, :seats) ON CONFLICT (org_id) DO NOTHING',
    { replacements: { orgId, seats: NEW_ORG_SEATS }, transaction })
  return (await BillingAccount.findByPk(orgId, options))!
}

/** Seats in use: members plus invitations still open (neither accepted, cancelled nor expired). */
export async function seatUsage(orgId: string, purchased: number, transaction?: Transaction): Promise<SeatsDto> {
  const [row] = await useDb().query<{ members: number; pending: number }>(`
    SELECT (SELECT count(*)::int FROM memberships WHERE org_id = :orgId) AS members,
           (SELECT count(*)::int FROM invitations WHERE org_id = :orgId AND accepted_at IS NULL
              AND cancelled_at IS NULL AND expires_at > now()) AS pending`,
  { replacements: { orgId }, type: QueryTypes.SELECT, transaction })
  const members = row?.members ?? 0
  const pending = row?.pending ?? 0
  return { purchased, members, pending, used: members + pending }
}
