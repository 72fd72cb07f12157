import type { Sequelize, Transaction } from 'sequelize'
import { DEMO_ORG_SEATS } from '../../server/services/billing-plan'
import type { SeededPeople } from './people'

// Demo organisations start with 5 seats and Stripe's test card; the Stripe customer and subscription are created
// by the app the first time billing is opened or an invitation is sent (the seed never needs Stripe).
export async function seedBilling(db: Sequelize, t: Transaction, people: SeededPeople): Promise<void> {
  for (const orgId of Object.values(people.orgs)) {
    await db.query('INSERT INTO billing_accounts (org_id, seats, demo_card) VALUES (:orgId, :seats, true)',
      { replacements: { orgId, seats: DEMO_ORG_SEATS }, transaction: t })
  }
}
