import { QueryTypes, type Sequelize } from 'sequelize'
import sqlite3 from 'sqlite3'

interface SqliteStatement {
  all(params: unknown[], callback: (err: Error | null, rows: unknown[]) => void): void
  finalize(callback?: () => void): void
}

interface SqliteDatabase {
  close(callback?: (err: Error | null) => void): void
}

/** The hot statements are few and fixed: a few SQL texts, and per text as many idle statements as queries ran at once. */
const MAX_TEXTS = 32
const MAX_IDLE_PER_TEXT = 16

/** Idle prepared statements of one connection, by SQL text. */
type Idle = Map<string, SqliteStatement[]>

const idleByDb = new WeakMap<SqliteDatabase, Idle>()

/**
 * The idle statements of one connection. Running a statement prepared earlier saves the driver a compile and a finalize
 * (two trips to its thread pool) per query. A statement runs one query at a time, so concurrent queries each take their
 * own. SQLite refuses to close a connection that still has statements, so the connection's close finalizes them first
 * (one still running is finalized by `release` when it ends).
 */
function idleOn(db: SqliteDatabase): Idle {
  let idle = idleByDb.get(db)
  if (idle) return idle
  const made: Idle = new Map()
  idle = made
  idleByDb.set(db, made)
  const close = db.close.bind(db)
  db.close = (callback) => {
    const open = [...made.values()].flat()
    made.clear()
    closed.add(db)
    let left = open.length
    if (!left) return close(callback)
    for (const s of open) s.finalize(() => --left === 0 && close(callback))
  }
  return made
}

const closed = new WeakSet<SqliteDatabase>()

type StatementClass = new (db: SqliteDatabase, sql: string, callback: (err: Error | null) => void) => SqliteStatement

/**
 * A statement from the idle list, or a newly prepared one once SQLite has compiled it. The driver's own `prepare` reports
 * only failures, and a query queued on a statement that failed to compile is never answered, so the query waits for
 * the compile (the driver's Statement constructor reports both).
 */
async function acquire(db: SqliteDatabase, sql: string): Promise<SqliteStatement> {
  const idle = idleOn(db).get(sql)?.pop()
  if (idle) return idle
  const Statement = (sqlite3 as unknown as { Statement: StatementClass }).Statement
  return new Promise((resolve, reject) => {
    const statement = new Statement(db, sql, (err) => (err ? reject(err) : resolve(statement)))
  })
}

function release(db: SqliteDatabase, sql: string, statement: SqliteStatement, ok: boolean): void {
  const idle = idleOn(db)
  let list = idle.get(sql)
  if (!list && ok && idle.size < MAX_TEXTS && !closed.has(db)) idle.set(sql, (list = []))
  // A statement that failed is not kept: the next query prepares afresh.
  if (ok && list && list.length < MAX_IDLE_PER_TEXT && !closed.has(db)) list.push(statement)
  else statement.finalize()
}

/**
 * A SELECT for the hottest per-request reads (the session, the signed-in user, the caseload fingerprint), written with
 * double-quoted names and `?` placeholders so the same text runs on both databases. On SQLite it goes straight to the
 * driver's shared connection, as a statement prepared once per connection: Sequelize's SQLite query layer formats a
 * stack trace and serialises every statement, which under load cost more than the statement. A statement that has run
 * to its end holds no read lock, so keeping it prepared does not hold back writers or WAL checkpoints. Rows come back as
 * the driver gives them (SQLite: dates as text, booleans as 0/1). PostgreSQL goes through sequelize.query with
 * replacements.
 */
export async function plainSelect<T extends object>(sequelize: Sequelize, sql: string, params: unknown[]): Promise<T[]> {
  if (sequelize.getDialect() !== 'sqlite') return sequelize.query<T>(sql, { replacements: params, type: QueryTypes.SELECT })
  const db = (await (sequelize.connectionManager as unknown as { getConnection(options: object): Promise<SqliteDatabase> }).getConnection({})) as SqliteDatabase
  const statement = await acquire(db, sql)
  return new Promise<T[]>((resolve, reject) =>
    statement.all(params, (err, rows) => {
      release(db, sql, statement, !err)
      if (err) reject(err)
      else resolve(rows as T[])
    }),
  )
}
