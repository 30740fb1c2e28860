import { randomBytes } from 'node:crypto'
import fs from 'node:fs'
import path from 'node:path'
import SequelizeStoreInit from 'connect-session-sequelize'
import session from 'express-session'
import type { Sequelize } from 'sequelize'
import type { Config } from '../config/env'
import { plainSelect } from '../db/plainSelect'
import type { SessionUsers } from './loadSessionUser'

const SequelizeStore = SequelizeStoreInit(session.Store)

declare module 'express-session' {
  interface SessionData {
    /** Epoch ms of sign-in and of the last recorded request (written at most once a minute): middleware/sessionTimeouts.ts */
    signedInAt?: number
    lastSeenAt?: number
  }
}

/**
 * In development and tests a secret is made once and kept in the data folder, so restarts keep people signed in.
 * Production must pass SESSION_SECRET (the config refuses to start without it).
 */
export function sessionSecret(config: Readonly<Config>): string {
  if (config.sessionSecret) return config.sessionSecret
  const file = path.join(config.dataDir, 'session-secret')
  try {
    return fs.readFileSync(file, 'utf8').trim()
  } catch {
    const secret = randomBytes(32).toString('base64url')
    fs.mkdirSync(config.dataDir, { recursive: true })
    fs.writeFileSync(file, secret, { mode: 0o600 })
    return secret
  }
}

export function createSessionMiddleware(config: Readonly<Config>, sequelize: Sequelize, users?: SessionUsers) {
  const store = new SequelizeStore({
    db: sequelize,
    table: 'Session',
    checkExpirationInterval: 15 * 60 * 1000,
    extendDefaultFields: (defaults: { data: string; expires: Date }, s: { passport?: { user?: string } }) => ({
      data: defaults.data,
      expires: defaults.expires,
      userId: s.passport?.user ?? null,
    }),
  })
  // express-session touches the store on every request it does not save (an UPDATE per request). The timeouts middleware
  // instead changes the session at most once a minute, and that save renews the row's expiry. With no touch at all
  // (rather than one that does nothing) express-session also skips its per-request touch check and the wrapped end.
  ;(store as { touch?: unknown }).touch = undefined
  // The read on every request, as the store's own get (the row's data; expiry is left to the cookie and the tidy-up), as
  // one plain statement that also brings the signed-in user for passport (auth/loadSessionUser.ts): the store's findOne
  // and a separate user query cost a PRAGMA lookup and per-column work each on SQLite besides the statements.
  const table = String((store as unknown as { sessionModel: { getTableName(): unknown } }).sessionModel.getTableName())
  store.get = (sid, done) => {
    const read = users ? users.readSession(table, sid) : plainSelect<{ data: string }>(sequelize, `SELECT "data" FROM "${table}" WHERE "sid" = ?`, [sid]).then(([row]) => row?.data ?? null)
    read.then((data) => done(null, data === null ? null : (JSON.parse(data) as session.SessionData)), (err: unknown) => done(err))
  }
  const middleware = session({
    name: 'rungs.sid',
    secret: sessionSecret(config),
    store,
    resave: false,
    saveUninitialized: false,
    // The cookie is renewed only when the session is saved (at most once a minute, see sessionTimeouts.ts).
    rolling: false,
    proxy: config.trustProxy,
    cookie: {
      httpOnly: true,
      sameSite: 'lax',
      // 'auto' marks the cookie Secure whenever the request arrived over TLS (directly or via a trusted proxy).
      secure: 'auto',
      // The absolute timeout: the middleware also refuses an older session, with a message the person can act on.
      maxAge: config.sessionAbsoluteMs,
    },
  })
  return { middleware, stop: () => store.stopExpiringSessions() }
}
