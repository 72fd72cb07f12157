import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize'
import type { VersionStatus } from '#shared/tables'

// lock_version is the optimistic lock: a save names the lock it read; a stale one gets 409.
export class TableVersion extends Model<InferAttributes<TableVersion>, InferCreationAttributes<TableVersion>> {
  declare id: CreationOptional<string>
  declare orgId: string
  declare tableId: string
  declare number: number
  declare status: CreationOptional<VersionStatus>
  declare authorId: string | null
  declare notes: CreationOptional<string>
  declare contentHash: string
  declare lockVersion: CreationOptional<number>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>

  static setup(sequelize: Sequelize) {
    TableVersion.init({
      id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
      orgId: { type: DataTypes.UUID, allowNull: false },
      tableId: { type: DataTypes.UUID, allowNull: false },
      number: { type: DataTypes.INTEGER, allowNull: false },
      status: { type: DataTypes.TEXT, defaultValue: 'draft' },
      authorId: { type: DataTypes.UUID, allowNull: true },
      notes: { type: DataTypes.TEXT, defaultValue: '' },
      contentHash: { type: DataTypes.TEXT, allowNull: false },
      lockVersion: { type: DataTypes.INTEGER, defaultValue: 0 },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    }, { sequelize, tableName: 'table_versions' })
  }
}
