import fs from 'node:fs'
import os from 'node:os'
import path from 'node:path'
import { randomBytes } from 'node:crypto'
import pg from 'pg'
import supertest from 'supertest'
import { createApp } from '../../server/app'
import { databaseTarget, loadConfig, type Config } from '../../server/config/env'
import { initModels } from '../../server/db/associations'
import { migrate } from '../../server/db/migrations'
import { seedDemoIfEmpty } from '../../server/db/seed'
import { openDatabase } from '../../server/db/sequelize'
import type { AppDeps } from '../../server/deps'
import { createLogger, silentLogger, type Logger } from '../../server/log/logger'
import { startFakeSmtp } from '../../server/mail/fakeSmtp'
import { createMailer } from '../../server/mail/transport'

export interface TestApp {
  app: ReturnType<typeof createApp>
  deps: AppDeps & { fakeSmtp: NonNullable<AppDeps['fakeSmtp']> }
  dataDir: string
  /** DATABASE_URL of this app's database, for a second instance on the same one. */
  databaseUrl: string
  close(): Promise<void>
}

/** The test log: silent, or pino lines on stdout with TEST_LOG=1. */
export const testLogger = (): Logger => (process.env.TEST_LOG ? createLogger({ level: 'debug' }) : silentLogger())

/**
 * A fresh database for one test file: a SQLite file in `dataDir`, or, when TEST_DATABASE_URL names a PostgreSQL server
 * (an account that may create databases), a new database there that `drop` removes.
 */
export async function freshDatabase(dataDir: string): Promise<{ url: string; drop(): Promise<void> }> {
  const admin = process.env.TEST_DATABASE_URL
  if (!admin) return { url: `sqlite:${path.join(dataDir, 'rungs.sqlite')}`, drop: async () => {} }
  const name = `rungs_t_${randomBytes(6).toString('hex')}`
  const run = async (sql: string) => {
    const client = new pg.Client({ connectionString: admin })
    await client.connect()
    try {
      await client.query(sql)
    } finally {
      await client.end()
    }
  }
  await run(`CREATE DATABASE ${name}`)
  const url = new URL(admin)
  url.pathname = `/${name}`
  // FORCE (PostgreSQL 13+) ends connections a test left open.
  return { url: url.toString(), drop: () => run(`DROP DATABASE IF EXISTS ${name} WITH (FORCE)`) }
}

/**
 * A fresh database (SQLite, or PostgreSQL under TEST_DATABASE_URL), a real fake SMTP server on a free port, and the app,
 * for one test file. Passing `env.DATABASE_URL` opens that database instead and leaves it in place on close. Pass `log`
 * to read the server's log lines back (see tests/api/logs.api.spec.ts).
 */
export async function makeTestApp(env: Record<string, string> = {}, overrides: Partial<Config> = {}, options: { log?: Logger } = {}): Promise<TestApp> {
  const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'rungs-test-'))
  const database = env.DATABASE_URL ? { url: env.DATABASE_URL, drop: async () => {} } : await freshDatabase(dataDir)
  const config = loadConfig({ NODE_ENV: 'test', DATA_DIR: dataDir, SCRYPT_COST: '1024', SEED_DEMO: 'true', APP_URL: 'http://localhost:3000', DATABASE_URL: database.url, ...env }, { clientDir: undefined, ...overrides })
  const sequelize = await openDatabase(databaseTarget(config))
  await migrate(sequelize)
  const models = initModels(sequelize)
  if (config.seedDemo) await seedDemoIfEmpty(models, config.scryptCost)
  const fakeSmtp = await startFakeSmtp({ port: 0, env: config.env })
  const mailer = createMailer({ fakePort: fakeSmtp.port, from: config.mailFrom })
  const deps = { config, sequelize, models, mailer, fakeSmtp, log: options.log ?? testLogger() }
  const app = createApp(deps)
  return {
    app,
    deps,
    dataDir,
    databaseUrl: database.url,
    async close() {
      app.stop()
      mailer.close()
      await fakeSmtp.close()
      await sequelize.close()
      await database.drop()
      fs.rmSync(dataDir, { recursive: true, force: true })
    },
  }
}

/** A cookie-keeping Supertest agent that has fetched a CSRF token; `token` is refreshed by signIn/signOut. */
export async function agentWithCsrf(app: TestApp['app']) {
  const agent = supertest.agent(app)
  const res = await agent.get('/api/auth/csrf').expect(200)
  const state = { agent, token: res.body.csrfToken as string }
  return {
    ...state,
    get token() { return state.token },
    post: (url: string, body?: object) => agent.post(url).set('x-csrf-token', state.token).send(body ?? {}),
    patch: (url: string, body?: object) => agent.patch(url).set('x-csrf-token', state.token).send(body ?? {}),
    del: (url: string) => agent.delete(url).set('x-csrf-token', state.token),
    get: (url: string) => agent.get(url),
    async signIn(email: string, password: string) {
      const r = await agent.post('/api/auth/signin').set('x-csrf-token', state.token).send({ email, password })
      if (r.body?.csrfToken) state.token = r.body.csrfToken
      return r
    },
    async signOut() {
      const r = await agent.post('/api/auth/signout').set('x-csrf-token', state.token).send({})
      if (r.body?.csrfToken) state.token = r.body.csrfToken
      return r
    },
  }
}

/** Pulls the first link to APP_URL out of a mail body. */
export function linkIn(text: string, pathPrefix: string): string {
  const m = text.match(new RegExp(`http://localhost:3000${pathPrefix}\\?token=([A-Za-z0-9_-]{43})`))
  if (!m?.[1]) throw new Error(`No ${pathPrefix} link in mail:\n${text}`)
  return m[1]
}
