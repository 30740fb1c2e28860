import fs from 'node:fs'
import path from 'node:path'
import { Sequelize, Transaction } from 'sequelize'

interface SqliteConnection {
  exec(sql: string, callback: (err: Error | null) => void): void
}

/** True for a PostgreSQL URL (postgres:// or postgresql://); anything else is a SQLite file. */
export const isPostgresUrl = (target: string): boolean => /^postgres(ql)?:\/\//.test(target)

/**
 * Opens the database `openDatabase` is given: a postgres:// URL, or a SQLite file (see `databaseTarget` in config/env).
 * The models and migrations are the same for both.
 */
export async function openDatabase(target: string): Promise<Sequelize> {
  return isPostgresUrl(target) ? openPostgres(target) : openSqlite(target)
}

/**
 * PostgreSQL: a connection pool and ordinary READ COMMITTED transactions. Services that read a row and then write it
 * lock what they read (`lock: transaction.LOCK.UPDATE`), so two app instances on one database cannot interleave there.
 */
async function openPostgres(url: string): Promise<Sequelize> {
  const sequelize = new Sequelize(url, {
    dialect: 'postgres',
    logging: false,
    pool: { max: 10, min: 0, idle: 10_000, acquire: 30_000 },
  })
  await sequelize.authenticate()
  return sequelize
}

/**
 * SQLite: the file (its folder created) in WAL mode, so readers never wait on the writer.
 *
 * SQLite has one writer at a time, and node-sqlite3 waits for a busy lock inside libuv's small thread pool. Sequelize
 * opens a separate connection per transaction, so several transactions waiting on each other can fill the pool and
 * starve the one holding the lock. Managed transactions therefore run one after another in this process, take the write
 * lock at BEGIN (IMMEDIATE), and every connection gets the same busy timeout and foreign-key setting as it opens.
 * Another process on the same file waits for the lock through the busy timeout.
 */
async function openSqlite(file: string): Promise<Sequelize> {
  if (file !== ':memory:') fs.mkdirSync(path.dirname(file), { recursive: true })
  const sequelize = new Sequelize({ dialect: 'sqlite', storage: file, logging: false, transactionType: Transaction.TYPES.IMMEDIATE })
  sequelize.addHook('afterConnect', (connection: unknown) =>
    new Promise<void>((resolve, reject) =>
      (connection as SqliteConnection).exec('PRAGMA foreign_keys = ON; PRAGMA busy_timeout = 5000;', (err) => (err ? reject(err) : resolve())),
    ),
  )
  queueTransactions(sequelize)
  await sequelize.query('PRAGMA journal_mode = WAL;')
  return sequelize
}

/** Runs managed transactions (the ones given a callback) strictly one at a time. */
function queueTransactions(sequelize: Sequelize): void {
  const original = sequelize.transaction.bind(sequelize) as (...args: unknown[]) => Promise<unknown>
  let tail: Promise<unknown> = Promise.resolve()
  sequelize.transaction = ((...args: unknown[]) => {
    if (!args.some((a) => typeof a === 'function')) return original(...args)
    const run = tail.then(() => original(...args))
    tail = run.catch(() => undefined)
    return run
  }) as typeof sequelize.transaction
}
