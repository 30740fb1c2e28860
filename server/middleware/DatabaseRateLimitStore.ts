import { createHash } from 'node:crypto'
import type { ClientRateLimitInfo, Options, Store } from 'express-rate-limit'
import { Op } from 'sequelize'
import type { RateLimitCounter } from '../db/models/RateLimitCounter'

const sha256 = (text: string) => createHash('sha256').update(text).digest('hex')

/**
 * An express-rate-limit store whose counters live in the database (table `rate_limits`), so every app instance on one
 * database counts the same hits: behind a load balancer, a client cannot multiply its attempts by the number of
 * instances. Works the same on SQLite and PostgreSQL.
 *
 * A hit is one upsert that starts a new window when the stored one has passed, else adds one; it runs in a transaction
 * with the read-back, so the count returned is the one this hit made. Expired rows are deleted now and then.
 */
export class DatabaseRateLimitStore implements Store {
  /** Counters are shared with other limiters' stores and other processes, told apart by `prefix`. */
  readonly localKeys = false
  readonly prefix: string
  private windowMs = 15 * 60 * 1000
  private lastTidy = 0

  constructor(
    private readonly counters: typeof RateLimitCounter,
    name: string,
    private readonly now: () => number = Date.now,
  ) {
    if (!/^[a-z0-9-]{1,60}$/.test(name)) throw new Error(`A rate limiter's name must be 1-60 of a-z, 0-9 and "-" (got "${name}")`)
    this.prefix = `${name}:`
  }

  init(options: Options): void {
    this.windowMs = options.windowMs
  }

  /** The client key (an IP address, an e-mail address) is stored only as a hash. */
  private rowKey(key: string): string {
    return `${this.prefix}${sha256(key)}`
  }

  async get(key: string): Promise<ClientRateLimitInfo | undefined> {
    const row = await this.counters.findByPk(this.rowKey(key))
    if (!row || row.resetAt <= this.now()) return undefined
    return { totalHits: row.hits, resetTime: new Date(row.resetAt) }
  }

  async increment(key: string): Promise<ClientRateLimitInfo> {
    const sequelize = this.counters.sequelize!
    const rowKey = this.rowKey(key)
    const now = this.now()
    const resetAt = now + this.windowMs
    // The SET expressions read the row as it was, so both CASEs see the old window. Portable: SQLite 3.24+ and
    // PostgreSQL 9.5+ both know INSERT ... ON CONFLICT DO UPDATE.
    const upsert = `INSERT INTO rate_limits ("key", "hits", "resetAt") VALUES (:rowKey, 1, :resetAt)
      ON CONFLICT ("key") DO UPDATE SET
        "hits" = CASE WHEN rate_limits."resetAt" <= :now THEN 1 ELSE rate_limits."hits" + 1 END,
        "resetAt" = CASE WHEN rate_limits."resetAt" <= :now THEN :resetAt ELSE rate_limits."resetAt" END`
    const info = await sequelize.transaction(async (transaction) => {
      await sequelize.query(upsert, { replacements: { rowKey, resetAt, now }, transaction })
      const row = await this.counters.findByPk(rowKey, { transaction })
      return { totalHits: row!.hits, resetTime: new Date(row!.resetAt) }
    })
    await this.tidy(now)
    return info
  }

  async decrement(key: string): Promise<void> {
    await this.counters.decrement('hits', { where: { key: this.rowKey(key), hits: { [Op.gt]: 0 }, resetAt: { [Op.gt]: this.now() } } })
  }

  async resetKey(key: string): Promise<void> {
    await this.counters.destroy({ where: { key: this.rowKey(key) } })
  }

  async resetAll(): Promise<void> {
    await this.counters.destroy({ where: { key: { [Op.startsWith]: this.prefix } } })
  }

  /** At most once a window per store, drops every limiter's expired rows; a failure here never fails the request. */
  private async tidy(now: number): Promise<void> {
    if (now - this.lastTidy < this.windowMs) return
    this.lastTidy = now
    await this.counters.destroy({ where: { resetAt: { [Op.lte]: now } } }).catch(() => undefined)
  }
}
