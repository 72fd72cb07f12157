import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize'

// A Stripe invoice as last read from the API. Amounts are minor units (BIGINT arrives as a string).
export class BillingInvoice extends Model<InferAttributes<BillingInvoice>, InferCreationAttributes<BillingInvoice>> {
  declare id: CreationOptional<string>
  declare orgId: string
  declare stripeInvoiceId: string
  declare number: string | null
  declare status: string
  declare billingReason: string | null
  declare amountDue: string
  declare amountPaid: string
  declare currency: string
  declare periodStart: Date | null
  declare periodEnd: Date | null
  declare hostedInvoiceUrl: string | null
  declare created: Date
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>

  static setup(sequelize: Sequelize) {
    BillingInvoice.init({
      id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
      orgId: { type: DataTypes.UUID, allowNull: false },
      stripeInvoiceId: { type: DataTypes.TEXT, allowNull: false, unique: true },
      number: { type: DataTypes.TEXT, allowNull: true },
      status: { type: DataTypes.TEXT, allowNull: false },
      billingReason: { type: DataTypes.TEXT, allowNull: true },
      amountDue: { type: DataTypes.BIGINT, allowNull: false },
      amountPaid: { type: DataTypes.BIGINT, allowNull: false },
      currency: { type: DataTypes.TEXT, allowNull: false },
      periodStart: { type: DataTypes.DATE, allowNull: true },
      periodEnd: { type: DataTypes.DATE, allowNull: true },
      hostedInvoiceUrl: { type: DataTypes.TEXT, allowNull: true },
      created: { type: DataTypes.DATE, allowNull: false },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    }, { sequelize, tableName: 'invoices' })
  }
}
