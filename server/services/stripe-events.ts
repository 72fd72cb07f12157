import type Stripe from 'stripe'
import { QueryTypes } from 'sequelize'
import { BillingAccount } from '../database/models'
import { syncBillingAccount } from './billing-sync'
import { isUuid } from '#shared/schemas/route-params'

/** The customer an event concerns, from whatever object it carries. */
export function eventCustomer(event: Stripe.Event): string | null {
  const object = event.data.object as { object?: string; id?: string; customer?: unknown }
  if (object.object === 'customer') return object.id ?? null
  if (typeof object.customer === 'string') return object.customer
  if (object.customer && typeof object.customer === 'object') return (object.customer as { id?: string }).id ?? null
  return null
}

/** Our organisation for a customer: the stored id, else the org_id we put in the customer's metadata. */
async function orgForCustomer(customerId: string): Promise<string | null> {
  const known = await BillingAccount.findOne({ where: { stripeCustomerId: customerId } })
  if (known) return known.orgId
  const customer = await useStripe().customers.retrieve(customerId).catch((error: { code?: string }) => {
    if (error.code === 'resource_missing') return null // not a customer of this account
    throw error
  })
  const orgId = !customer || customer.deleted ? null : customer.metadata.org_id
  return isUuid(orgId) && await BillingAccount.findByPk(orgId) ? orgId : null // metadata is free text: never cast it unchecked
}

/**
 * Records the event id and brings the organisation's billing up to date in one transaction. A repeated event id is
 * ignored; the state is re-read through the API, so the order in which events arrive does not matter.
 */
export async function processStripeEvent(stripeEvent: Stripe.Event): Promise<'processed' | 'duplicate' | 'ignored'> {
  const customerId = eventCustomer(stripeEvent)
  const orgId = customerId ? await orgForCustomer(customerId) : null
  return inTransaction(async (t) => {
    const inserted = await useDb().query<{ id: string }>(
      'INSERT INTO stripe_events (id, type, org_id) VALUES (:id, :type, :orgId) ON CONFLICT (id) DO NOTHING RETURNING id',
      { replacements: { id: stripeEvent.id, type: stripeEvent.type, orgId }, type: QueryTypes.SELECT, transaction: t })
    if (!inserted.length) return 'duplicate'
    if (!orgId || !customerId) return 'ignored'
    await syncBillingAccount(null, orgId, t, `webhook ${stripeEvent.type} ${stripeEvent.id}`, customerId)
    return 'processed'
  })
}
