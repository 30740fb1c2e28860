import { DataTypes, Model, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize'

/**
 * One rate-limit window for one client of one limiter, shared by every app instance on the database. `key` is the
 * limiter's name and a SHA-256 of the client key (an IP address or an e-mail address), so no address is stored.
 * `resetAt` is epoch milliseconds, compared as a number on both SQLite and PostgreSQL.
 */
export class RateLimitCounter extends Model<InferAttributes<RateLimitCounter>, InferCreationAttributes<RateLimitCounter>> {
  declare key: string
  declare hits: number
  declare resetAt: number

  static initModel(sequelize: Sequelize): void {
    this.init(
      {
        key: { type: DataTypes.STRING(128), primaryKey: true },
        hits: { type: DataTypes.INTEGER, allowNull: false },
        // BIGINT comes back from pg as a string; the getter makes it a number again.
        resetAt: { type: DataTypes.BIGINT, allowNull: false, get() { return Number(this.getDataValue('resetAt')) } },
      },
      { sequelize, tableName: 'rate_limits', timestamps: false },
    )
  }
}
