import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize'

// Append-only (a trigger refuses UPDATE and DELETE; the app's role has neither grant).
// Each event's hash covers the previous hash of its chain and its own canonical content.
export class AuditEvent extends Model<InferAttributes<AuditEvent>, InferCreationAttributes<AuditEvent>> {
  declare id: CreationOptional<string>
  declare orgId: string | null
  declare actorId: string | null
  declare actorEmail: string | null
  declare action: string
  declare objectType: string | null
  declare objectId: string | null
  declare outcome: 'ok' | 'denied' | 'failed'
  declare requestId: string | null
  declare ip: string | null
  declare detail: Record<string, unknown>
  declare at: Date
  declare prevHash: string | null
  declare hash: string

  static setup(sequelize: Sequelize) {
    AuditEvent.init({
      id: { type: DataTypes.BIGINT, primaryKey: true, autoIncrement: true },
      orgId: { type: DataTypes.UUID, allowNull: true },
      actorId: { type: DataTypes.UUID, allowNull: true },
      actorEmail: { type: DataTypes.TEXT, allowNull: true },
      action: { type: DataTypes.TEXT, allowNull: false },
      objectType: { type: DataTypes.TEXT, allowNull: true },
      objectId: { type: DataTypes.TEXT, allowNull: true },
      outcome: { type: DataTypes.TEXT, allowNull: false },
      requestId: { type: DataTypes.TEXT, allowNull: true },
      ip: { type: DataTypes.TEXT, allowNull: true },
      detail: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
      at: { type: DataTypes.DATE, allowNull: false },
      prevHash: { type: DataTypes.TEXT, allowNull: true },
      hash: { type: DataTypes.TEXT, allowNull: false },
    }, { sequelize, tableName: 'audit_events', timestamps: false })
  }
}
