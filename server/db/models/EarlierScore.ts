import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize'
import type { InstrumentId } from '../../../shared/content/measureForms'
import type { User } from './User'

/**
 * A questionnaire total from before Rungs (e.g. an intake on paper), entered by the therapist so that change is counted
 * from the true first score. Belongs to one link and goes when the link ends, like the shared copies.
 */
export class EarlierScore extends Model<InferAttributes<EarlierScore>, InferCreationAttributes<EarlierScore>> {
  declare id: CreationOptional<string>
  declare linkId: string
  declare instrument: InstrumentId
  /** YYYY-MM-DD. */
  declare takenOn: string
  declare total: number
  /** PHQ-9 item 9 when the therapist gave it; null = unknown, never taken as 0. */
  declare item9: number | null
  declare enteredById: string
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
  declare enteredBy?: User

  static initModel(sequelize: Sequelize): void {
    this.init(
      {
        id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
        linkId: { type: DataTypes.UUID, allowNull: false },
        instrument: { type: DataTypes.STRING(8), allowNull: false },
        takenOn: { type: DataTypes.DATEONLY, allowNull: false },
        total: { type: DataTypes.INTEGER, allowNull: false },
        item9: { type: DataTypes.INTEGER, allowNull: true },
        enteredById: { type: DataTypes.UUID, allowNull: false },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'earlier_scores' },
    )
  }
}
