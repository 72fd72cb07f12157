import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize'

// Server-side record behind each sealed cookie, so a session can be revoked.
export class SessionRecord extends Model<InferAttributes<SessionRecord>, InferCreationAttributes<SessionRecord>> {
  declare id: CreationOptional<string>
  declare userId: string
  declare expiresAt: Date
  declare lastSeenAt: CreationOptional<Date>
  declare revokedAt: Date | null
  declare revokedReason: string | null
  declare ip: string | null
  declare userAgent: string | null
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>

  static setup(sequelize: Sequelize) {
    SessionRecord.init({
      id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
      userId: { type: DataTypes.UUID, allowNull: false },
      expiresAt: { type: DataTypes.DATE, allowNull: false },
      lastSeenAt: { type: DataTypes.DATE, defaultValue: DataTypes.NOW },
      revokedAt: { type: DataTypes.DATE, allowNull: true },
      revokedReason: { type: DataTypes.TEXT, allowNull: true },
      ip: { type: DataTypes.TEXT, allowNull: true },
      userAgent: { type: DataTypes.TEXT, allowNull: true },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    }, { sequelize, tableName: 'sessions' })
  }
}
