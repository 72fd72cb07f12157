import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize'
import type { Role } from '#shared/permissions'

// An invitation to join an organisation; the link's token is stored only as its SHA-256 hash.
export class Invitation extends Model<InferAttributes<Invitation>, InferCreationAttributes<Invitation>> {
  declare id: CreationOptional<string>
  declare orgId: string
  declare email: string
  declare role: Role
  declare tokenHash: string
  declare invitedBy: string | null
  declare expiresAt: Date
  declare sentAt: CreationOptional<Date>
  declare acceptedAt: CreationOptional<Date | null>
  declare acceptedBy: CreationOptional<string | null>
  declare cancelledAt: CreationOptional<Date | null>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>

  static setup(sequelize: Sequelize) {
    Invitation.init({
      id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
      orgId: { type: DataTypes.UUID, allowNull: false },
      email: { type: DataTypes.TEXT, allowNull: false },
      role: { type: DataTypes.TEXT, allowNull: false },
      tokenHash: { type: DataTypes.TEXT, allowNull: false },
      invitedBy: { type: DataTypes.UUID, allowNull: true },
      expiresAt: { type: DataTypes.DATE, allowNull: false },
      sentAt: { type: DataTypes.DATE, defaultValue: DataTypes.NOW },
      acceptedAt: { type: DataTypes.DATE, allowNull: true },
      acceptedBy: { type: DataTypes.UUID, allowNull: true },
      cancelledAt: { type: DataTypes.DATE, allowNull: true },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    }, { sequelize, tableName: 'invitations' })
  }
}
