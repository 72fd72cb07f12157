import type { Sequelize } from 'sequelize'
import { Organisation } from './organisation'
import { User } from './user'
import { Membership } from './membership'
import { SessionRecord } from './session'
import { AuditEvent } from './audit-event'
import { RateTable } from './rate-table'
import { TableVersion } from './table-version'

export { Organisation, User, Membership, SessionRecord, AuditEvent, RateTable, TableVersion }

// Model registry: each feature adds its models here (setup + associations).
export function initModels(sequelize: Sequelize) {
  for (const model of [Organisation, User, Membership, SessionRecord, AuditEvent, RateTable, TableVersion]) model.setup(sequelize)
  Membership.belongsTo(Organisation, { foreignKey: 'orgId', as: 'organisation' })
  Membership.belongsTo(User, { foreignKey: 'userId', as: 'user' })
  Organisation.hasMany(Membership, { foreignKey: 'orgId', as: 'memberships' })
  User.hasMany(Membership, { foreignKey: 'userId', as: 'memberships' })
  RateTable.hasMany(TableVersion, { foreignKey: 'tableId', as: 'versions' })
  TableVersion.belongsTo(RateTable, { foreignKey: 'tableId', as: 'table' })
}
