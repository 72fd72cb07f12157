import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize'
import type { Axis, AxisUnit, ColAxis, Shape, TableKind, ValueUnit } from '#shared/tables'
import type { Compounding } from '#shared/engine/contract'

export class RateTable extends Model<InferAttributes<RateTable>, InferCreationAttributes<RateTable>> {
  declare id: CreationOptional<string>
  declare orgId: string
  declare name: string
  declare kind: TableKind
  declare axis: Axis
  declare axisUnit: CreationOptional<AxisUnit>
  declare valueUnit: CreationOptional<ValueUnit>
  declare shape: CreationOptional<Shape>
  declare colAxis: CreationOptional<ColAxis | null>
  declare colAxisUnit: CreationOptional<AxisUnit | null>
  declare hasUltimate: CreationOptional<boolean>
  /** How a curve's spot rates compound (migration 1102); annual for every other kind. */
  declare compounding: CreationOptional<Compounding>
  declare description: CreationOptional<string>
  declare tags: CreationOptional<string[]>
  declare createdBy: string | null
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>

  static setup(sequelize: Sequelize) {
    RateTable.init({
      id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
      orgId: { type: DataTypes.UUID, allowNull: false },
      name: { type: DataTypes.TEXT, allowNull: false },
      kind: { type: DataTypes.TEXT, allowNull: false },
      axis: { type: DataTypes.TEXT, allowNull: false },
      axisUnit: { type: DataTypes.TEXT, defaultValue: 'years' },
      valueUnit: { type: DataTypes.TEXT, defaultValue: 'per-unit' },
      shape: { type: DataTypes.TEXT, defaultValue: 'one-way' },
      colAxis: { type: DataTypes.TEXT, allowNull: true },
      colAxisUnit: { type: DataTypes.TEXT, allowNull: true },
      hasUltimate: { type: DataTypes.BOOLEAN, defaultValue: false },
      compounding: { type: DataTypes.TEXT, defaultValue: 'annual' },
      description: { type: DataTypes.TEXT, defaultValue: '' },
      tags: { type: DataTypes.ARRAY(DataTypes.TEXT), defaultValue: [] },
      createdBy: { type: DataTypes.UUID, allowNull: true },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    }, { sequelize, tableName: 'rate_tables' })
  }
}
