import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize'

// A sign-up waiting for its e-mailed link (migration 0801); the token is stored only as its SHA-256 hash.
export class SignupRequest extends Model<InferAttributes<SignupRequest>, InferCreationAttributes<SignupRequest>> {
  declare id: CreationOptional<string>
  declare email: string
  declare tokenHash: string
  declare expiresAt: Date
  declare usedAt: CreationOptional<Date | null>
  declare createdAt: CreationOptional<Date>

  static setup(sequelize: Sequelize) {
    SignupRequest.init({
      id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
      email: { type: DataTypes.TEXT, allowNull: false },
      tokenHash: { type: DataTypes.TEXT, allowNull: false },
      expiresAt: { type: DataTypes.DATE, allowNull: false },
      usedAt: { type: DataTypes.DATE, allowNull: true },
      createdAt: DataTypes.DATE,
    }, { sequelize, tableName: 'signup_requests', updatedAt: false })
  }
}
