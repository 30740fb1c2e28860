import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize'

/** A therapist's working note about one link. Never returned to the person. */
export class PrepNote extends Model<InferAttributes<PrepNote>, InferCreationAttributes<PrepNote>> {
  declare id: CreationOptional<string>
  declare linkId: string
  declare therapistId: string
  declare text: string
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>

  static initModel(sequelize: Sequelize): void {
    this.init(
      {
        id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
        linkId: { type: DataTypes.UUID, allowNull: false },
        therapistId: { type: DataTypes.UUID, allowNull: false },
        text: { type: DataTypes.TEXT, allowNull: false },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'prep_notes' },
    )
  }
}
