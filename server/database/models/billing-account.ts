import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize'

// The organisation's mirror of its Stripe customer and subscription (seats = subscription quantity).
export class BillingAccount extends Model<InferAttributes<BillingAccount>, InferCreationAttributes<BillingAccount>> {
  declare orgId: string
  declare stripeCustomerId: CreationOptional<string | null>
  declare stripeSubscriptionId: CreationOptional<string | null>
  declare seats: number
  declare status: CreationOptional<string>
  declare currentPeriodEnd: CreationOptional<Date | null>
  declare cardBrand: CreationOptional<string | null>
  declare cardLast4: CreationOptional<string | null>
  declare demoCard: CreationOptional<boolean>
  declare syncedAt: CreationOptional<Date | null>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>

  static setup(sequelize: Sequelize) {
    BillingAccount.init({
      orgId: { type: DataTypes.UUID, primaryKey: true },
      stripeCustomerId: { type: DataTypes.TEXT, allowNull: true },
      stripeSubscriptionId: { type: DataTypes.TEXT, allowNull: true },
      seats: { type: DataTypes.INTEGER, allowNull: false },
      status: { type: DataTypes.TEXT, defaultValue: 'not_started' },
      currentPeriodEnd: { type: DataTypes.DATE, allowNull: true },
      cardBrand: { type: DataTypes.TEXT, allowNull: true },
      cardLast4: { type: DataTypes.TEXT, allowNull: true },
      demoCard: { type: DataTypes.BOOLEAN, defaultValue: false },
      syncedAt: { type: DataTypes.DATE, allowNull: true },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    }, { sequelize, tableName: 'billing_accounts' })
  }
}
