import { DataTypes, type QueryInterface } from 'sequelize'

export const name = '0005-rate-limits'

/** Rate-limit counters in the database, so every app instance behind a load balancer counts the same hits. */
export async function up({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.createTable('rate_limits', {
    key: { type: DataTypes.STRING(128), primaryKey: true },
    hits: { type: DataTypes.INTEGER, allowNull: false },
    resetAt: { type: DataTypes.BIGINT, allowNull: false },
  })
  // Tidying deletes by expiry.
  await qi.addIndex('rate_limits', ['resetAt'])
}

export async function down({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.dropTable('rate_limits')
}
