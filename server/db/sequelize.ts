import fs from 'node:fs'
import path from 'node:path'
import { Sequelize, Transaction } from 'sequelize'

interface SqliteConnection {
  exec(sql: string, callback: (err: Error | null) => void): void
}

/**
 * Opens the SQLite file (creating its folder) in WAL mode, so readers never wait on the writer.
 *
 * SQLite has one writer at a time, and node-sqlite3 waits for a busy lock inside libuv's small thread pool. Sequelize
 * opens a separate connection per transaction, so several transactions waiting on each other can fill the pool and
 * starve the one holding the lock. Managed transactions therefore run one after another in this process, take the write
 * lock at BEGIN (IMMEDIATE), and every connection gets the same busy timeout and foreign-key setting as it opens.
 */
export async function openDatabase(file: string): Promise<Sequelize> {
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
