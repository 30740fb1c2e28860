import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute, type Sequelize } from 'sequelize'
import type { Role } from '../../../shared/schemas/auth.schema'
import type { TherapistProfile } from './TherapistProfile'

export class User extends Model<InferAttributes<User>, InferCreationAttributes<User>> {
  declare id: CreationOptional<string>
  declare email: string
  declare passwordHash: string
  declare role: Role
  declare displayName: string
  declare emailVerifiedAt: Date | null
  declare emailNotices: CreationOptional<boolean>
  declare disabledAt: Date | null
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
  declare therapistProfile?: NonAttribute<TherapistProfile | null>

  static initModel(sequelize: Sequelize): void {
    this.init(
      {
        id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
        email: { type: DataTypes.STRING(254), allowNull: false, unique: true },
        passwordHash: { type: DataTypes.STRING, allowNull: false },
        role: { type: DataTypes.STRING(16), allowNull: false },
        displayName: { type: DataTypes.STRING(80), allowNull: false },
        emailVerifiedAt: { type: DataTypes.DATE, allowNull: true },
        emailNotices: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
        disabledAt: { type: DataTypes.DATE, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'users' },
    )
  }
}
