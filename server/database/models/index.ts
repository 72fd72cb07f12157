import type { Sequelize } from 'sequelize'
import { Organisation } from './organisation'
import { User } from './user'
import { Membership } from './membership'
import { SessionRecord } from './session'
import { AuditEvent } from './audit-event'
import { RateTable } from './rate-table'
import { TableVersion } from './table-version'
import { Invitation } from './invitation'
import { PasswordReset } from './password-reset'
import { BillingAccount } from './billing-account'
import { BillingInvoice } from './billing-invoice'
import { SignupRequest } from './signup-request'

export { Organisation, User, Membership, SessionRecord, AuditEvent, RateTable, TableVersion }

export { Invitation, PasswordReset, BillingAccount, BillingInvoice, SignupRequest }

// Model registry: each feature adds its models here (setup + associations).
export function initModels(sequelize: Sequelize) {
  for (const model of [Organisation, User, Membership, SessionRecord, AuditEvent, RateTable, TableVersion]) model.setup(sequelize)
  for (const model of [Invitation, PasswordReset, BillingAccount, BillingInvoice, SignupRequest]) model.setup(sequelize)
  Membership.belongsTo(Organisation, { foreignKey: 'orgId', as: 'organisation' })
  Membership.belongsTo(User, { foreignKey: 'userId', as: 'user' })
  Organisation.hasMany(Membership, { foreignKey: 'orgId', as: 'memberships' })
  User.hasMany(Membership, { foreignKey: 'userId', as: 'memberships' })
  RateTable.hasMany(TableVersion, { foreignKey: 'tableId', as: 'versions' })
  TableVersion.belongsTo(RateTable, { foreignKey: 'tableId', as: 'table' })
}
