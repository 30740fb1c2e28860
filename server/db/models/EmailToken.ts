import { DataTypes, Model, type CreationOptional, type ForeignKey, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize'
import type { User } from './User'

export type TokenPurpose = 'verify' | 'reset'

/** A single-use e-mailed token. Only its SHA-256 is stored, so a leaked database cannot be used to reset passwords. */
export class EmailToken extends Model<InferAttributes<EmailToken>, InferCreationAttributes<EmailToken>> {
  declare id: CreationOptional<string>
  declare userId: ForeignKey<User['id']>
  declare purpose: TokenPurpose
  declare tokenHash: string
  declare expiresAt: Date
  declare usedAt: Date | null
  declare createdAt: CreationOptional<Date>

  static initModel(sequelize: Sequelize): void {
    this.init(
      {
        id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
        purpose: { type: DataTypes.STRING(16), allowNull: false },
        tokenHash: { type: DataTypes.STRING(64), allowNull: false, unique: true },
        expiresAt: { type: DataTypes.DATE, allowNull: false },
        usedAt: { type: DataTypes.DATE, allowNull: true },
        createdAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'email_tokens', updatedAt: false },
    )
  }
}
