import { QueryTypes, type Sequelize } from 'sequelize'

interface SqliteDatabase {
  all(sql: string, params: unknown[], callback: (err: Error | null, rows: unknown[]) => void): void
}

/**
 * A SELECT for the hottest per-request reads (the session, the signed-in user, the caseload fingerprint), written with
 * double-quoted names and `?` placeholders so the same text runs on both databases. On SQLite it goes straight to the
 * driver's shared connection: Sequelize's SQLite query layer formats a stack trace and serialises every statement,
 * which under load cost more than the statement. Rows come back as the driver gives them (SQLite: dates as text,
 * booleans as 0/1). PostgreSQL goes through sequelize.query with replacements.
 */
export async function plainSelect<T extends object>(sequelize: Sequelize, sql: string, params: unknown[]): Promise<T[]> {
  if (sequelize.getDialect() !== 'sqlite') return sequelize.query<T>(sql, { replacements: params, type: QueryTypes.SELECT })
  const db = (await (sequelize.connectionManager as unknown as { getConnection(options: object): Promise<SqliteDatabase> }).getConnection({})) as SqliteDatabase
  return new Promise<T[]>((resolve, reject) => db.all(sql, params, (err, rows) => (err ? reject(err) : resolve(rows as T[]))))
}
