import { DataTypes, Model, type CreationOptional, type ForeignKey, type InferAttributes, type InferCreationAttributes, type NonAttribute, type Sequelize } from 'sequelize'
import type { User } from './User'

export class TherapistProfile extends Model<InferAttributes<TherapistProfile>, InferCreationAttributes<TherapistProfile>> {
  declare id: CreationOptional<string>
  declare userId: ForeignKey<User['id']>
  declare practice: string
  declare registration: string
  declare approvedAt: Date | null
  declare approvedById: ForeignKey<User['id']> | null
  /** Ids from approvalChecks in shared/schemas/admin.schema.ts, as JSON text. */
  declare approvalChecks: string | null
  declare approvalNote: string | null
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
  declare approvedBy?: NonAttribute<User | null>

  static initModel(sequelize: Sequelize): void {
    this.init(
      {
        id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
        practice: { type: DataTypes.STRING(120), allowNull: false },
        registration: { type: DataTypes.STRING(200), allowNull: false },
        approvedAt: { type: DataTypes.DATE, allowNull: true },
        approvalChecks: { type: DataTypes.TEXT, allowNull: true },
        approvalNote: { type: DataTypes.TEXT, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'therapist_profiles' },
    )
  }
}
