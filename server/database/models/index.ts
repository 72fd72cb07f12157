import type { Sequelize } from 'sequelize'
import { Organisation } from './organisation'
import { User } from './user'
import { Membership } from './membership'
import { SessionRecord } from './session'
import { RateTable } from './rate-table'
import { Invitation } from './invitation'
import { PasswordReset } from './password-reset'
import { BillingAccount } from './billing-account'
import { BillingInvoice } from './billing-invoice'
import { SignupRequest } from './signup-request'

export { Organisation, User, Membership, SessionRecord, RateTable }

export { Invitation, PasswordReset, BillingAccount, BillingInvoice, SignupRequest }

// Model registry: each feature adds its models here (setup + associations). Versions, points, fills and audit events
// are written with SQL in the services (set-based writes, locks and triggers matter there), so they have no model.
export function initModels(sequelize: Sequelize) {
  for (const model of [Organisation, User, Membership, SessionRecord, RateTable]) model.setup(sequelize)
  for (const model of [Invitation, PasswordReset, BillingAccount, BillingInvoice, SignupRequest]) model.setup(sequelize)
  Membership.belongsTo(Organisation, { foreignKey: 'orgId', as: 'organisation' })
  Membership.belongsTo(User, { foreignKey: 'userId', as: 'user' })
  Organisation.hasMany(Membership, { foreignKey: 'orgId', as: 'memberships' })
  User.hasMany(Membership, { foreignKey: 'userId', as: 'memberships' })
}
