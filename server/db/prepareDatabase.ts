import type { Sequelize } from 'sequelize'
import { initModels, type Models } from './associations'
import { migrate } from './migrations'
import { seedDemoIfEmpty } from './seed'

// Any fixed number; it names Rungs' start-up lock among the database's advisory locks.
const STARTUP_LOCK = 4_760_211

// SQLite: instances in one process (tests) take turns per file. Separate processes on one SQLite file are not a supported
// way to run Rungs; PostgreSQL is (see README, "Growing past one machine").
const sqliteTurns = new Map<string, Promise<unknown>>()

/**
 * Migrates, initialises the models and seeds the demo when asked, while holding a lock, so several instances starting
 * at once on one empty database do not run the same migration twice. PostgreSQL: a session advisory lock on a connection
 * of its own, released at the end.
 */
export async function prepareDatabase(sequelize: Sequelize, opts: { seedDemo: boolean; scryptCost: number }): Promise<{ models: Models; applied: string[]; seeded: boolean }> {
  const work = async () => {
    const applied = await migrate(sequelize)
    const models = initModels(sequelize)
    const seeded = opts.seedDemo ? await seedDemoIfEmpty(models, opts.scryptCost) : false
    return { models, applied, seeded }
  }
  if (sequelize.getDialect() === 'postgres') return withAdvisoryLock(sequelize, work)
  const file = String((sequelize as unknown as { options: { storage?: string } }).options.storage)
  const turn = (sqliteTurns.get(file) ?? Promise.resolve()).then(work)
  sqliteTurns.set(file, turn.catch(() => undefined))
  return turn
}

interface PgConnection {
  query(sql: string, values?: unknown[]): Promise<unknown>
}

async function withAdvisoryLock<T>(sequelize: Sequelize, work: () => Promise<T>): Promise<T> {
  const manager = sequelize.connectionManager as unknown as { getConnection(): Promise<PgConnection>; releaseConnection(c: PgConnection): Promise<void> }
  const connection = await manager.getConnection()
  try {
    await connection.query('SELECT pg_advisory_lock($1)', [STARTUP_LOCK])
    try {
      return await work()
    } finally {
      await connection.query('SELECT pg_advisory_unlock($1)', [STARTUP_LOCK])
    }
  } finally {
    await manager.releaseConnection(connection)
  }
}
