import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize'

/** A therapist's single-use invitation code. Only the code's SHA-256 is stored. */
export class Invitation extends Model<InferAttributes<Invitation>, InferCreationAttributes<Invitation>> {
  declare id: CreationOptional<string>
  declare therapistId: string
  declare codeHash: string
  declare expiresAt: Date
  declare email: string | null
  declare usedAt: Date | null
  declare createdAt: CreationOptional<Date>

  static initModel(sequelize: Sequelize): void {
    this.init(
      {
        id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
        therapistId: { type: DataTypes.UUID, allowNull: false },
        codeHash: { type: DataTypes.STRING(64), allowNull: false, unique: true },
        expiresAt: { type: DataTypes.DATE, allowNull: false },
        email: { type: DataTypes.STRING(254), allowNull: true },
        usedAt: { type: DataTypes.DATE, allowNull: true },
        createdAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'invitations', updatedAt: false },
    )
  }
}
