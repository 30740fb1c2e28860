import { DataTypes, Model, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize'

/** express-session rows, written by connect-session-sequelize. `userId` lets "sign out everywhere" find them. */
export class Session extends Model<InferAttributes<Session>, InferCreationAttributes<Session>> {
  declare sid: string
  declare expires: Date | null
  declare data: string | null
  declare userId: string | null

  static initModel(sequelize: Sequelize): void {
    this.init(
      {
        sid: { type: DataTypes.STRING(64), primaryKey: true },
        expires: { type: DataTypes.DATE, allowNull: true },
        data: { type: DataTypes.TEXT, allowNull: true },
        userId: { type: DataTypes.UUID, allowNull: true },
      },
      { sequelize, tableName: 'sessions' },
    )
  }
}
