import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute, type Sequelize } from 'sequelize'
import type { User } from './User'

export type LinkState = 'pending' | 'active' | 'ended'

/** The connection between one person and one therapist. */
export class Link extends Model<InferAttributes<Link>, InferCreationAttributes<Link>> {
  declare id: CreationOptional<string>
  declare personId: string
  declare therapistId: string
  declare state: LinkState
  declare startedAt: Date | null
  declare endedAt: Date | null
  /** The user id of whoever ended the link. */
  declare endedBy: string | null
  declare createdAt: CreationOptional<Date>
  declare person?: NonAttribute<User>
  declare therapist?: NonAttribute<User>

  static initModel(sequelize: Sequelize): void {
    this.init(
      {
        id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
        personId: { type: DataTypes.UUID, allowNull: false },
        therapistId: { type: DataTypes.UUID, allowNull: false },
        state: { type: DataTypes.STRING(16), allowNull: false },
        startedAt: { type: DataTypes.DATE, allowNull: true },
        endedAt: { type: DataTypes.DATE, allowNull: true },
        endedBy: { type: DataTypes.UUID, allowNull: true },
        createdAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'links', updatedAt: false },
    )
  }
}
