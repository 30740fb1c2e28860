import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize'

/** A session between the two sides of a link; "since the last session" counts from the latest past one. */
export class Appointment extends Model<InferAttributes<Appointment>, InferCreationAttributes<Appointment>> {
  declare id: CreationOptional<string>
  declare linkId: string
  declare at: Date
  declare createdAt: CreationOptional<Date>

  static initModel(sequelize: Sequelize): void {
    this.init(
      {
        id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
        linkId: { type: DataTypes.UUID, allowNull: false },
        at: { type: DataTypes.DATE, allowNull: false },
        createdAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'appointments', updatedAt: false },
    )
  }
}
