import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute, type Sequelize } from 'sequelize'
import type { Role } from '#shared/permissions'
import type { Organisation } from './organisation'
import type { User } from './user'

// One role per person per organisation (unique org_id, user_id).
export class Membership extends Model<InferAttributes<Membership>, InferCreationAttributes<Membership>> {
  declare id: CreationOptional<string>
  declare orgId: string
  declare userId: string
  declare role: Role
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
  declare organisation?: NonAttribute<Organisation>
  declare user?: NonAttribute<User>

  static setup(sequelize: Sequelize) {
    Membership.init({
      id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
      orgId: { type: DataTypes.UUID, allowNull: false },
      userId: { type: DataTypes.UUID, allowNull: false },
      role: { type: DataTypes.TEXT, allowNull: false },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    }, { sequelize, tableName: 'memberships' })
  }
}
