import fs from 'node:fs'
import os from 'node:os'
import path from 'node:path'
import supertest from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { createApp } from '../../server/app'
import { ConfigError, loadConfig } from '../../server/config/env'
import { initModels } from '../../server/db/associations'
import { migrate } from '../../server/db/migrations'
import { demoAccounts, seedDemoIfEmpty } from '../../server/db/seed'
import { openDatabase } from '../../server/db/sequelize'
import type { AppDeps } from '../../server/deps'
import { startFakeSmtp } from '../../server/mail/fakeSmtp'
import { createMailer } from '../../server/mail/transport'
import { silentLogger } from '../../server/log/logger'
import { agentWithCsrf } from '../helpers/testApp'

const secret = 'a-production-session-secret-of-40-chars!'
// Nothing listens on port 1: no test here sends mail, and none must reach a real server.
const smtpUrl = 'smtp://127.0.0.1:1'

/** Runs loadConfig and returns the ConfigError it throws. */
function configErrorFor(env: Record<string, string>): ConfigError {
  try {
    loadConfig(env)
  } catch (err) {
    if (err instanceof ConfigError) return err
    throw err
  }
  throw new Error('loadConfig accepted the configuration')
}

describe('production configuration', () => {
  it('refuses to start without SESSION_SECRET', () => {
    const err = configErrorFor({ NODE_ENV: 'production', SMTP_URL: smtpUrl })
    expect(err.message).toMatch(/SESSION_SECRET: is required/)
    expect(err.message).not.toMatch(/SMTP_URL/)
  })

  it('refuses to start without SMTP_URL', () => {
    const err = configErrorFor({ NODE_ENV: 'production', SESSION_SECRET: secret })
    expect(err.message).toMatch(/SMTP_URL: is required/)
    expect(err.message).not.toMatch(/SESSION_SECRET/)
  })

  it('refuses to start the local fake mail server', async () => {
    await expect(startFakeSmtp({ port: 0, env: 'production' })).rejects.toThrow(/SMTP_URL/)
  })
})

describe('an app built for production', () => {
  let deps: AppDeps
  let app: ReturnType<typeof createApp>
  let dataDir: string

  beforeAll(async () => {
    dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'rungs-prod-'))
    const config = loadConfig(
      { NODE_ENV: 'production', DATA_DIR: dataDir, SESSION_SECRET: secret, SMTP_URL: smtpUrl, SCRYPT_COST: '1024', SEED_DEMO: 'true' },
      { clientDir: undefined },
    )
    const sequelize = await openDatabase(config.databaseFile)
    await migrate(sequelize)
    const models = initModels(sequelize)
    await seedDemoIfEmpty(models, config.scryptCost)
    const mailer = createMailer({ smtpUrl: config.smtpUrl, from: config.mailFrom })
    deps = { config, sequelize, models, mailer, log: silentLogger() }
    app = createApp(deps)
  })
  afterAll(async () => {
    app.stop()
    deps.mailer.close()
    await deps.sequelize.close()
    fs.rmSync(dataDir, { recursive: true, force: true })
  })

  it('has no sent-mail route, even for a signed-in admin', async () => {
    const a = await agentWithCsrf(app)
    expect((await a.signIn(demoAccounts.admin.email, demoAccounts.admin.password)).status).toBe(200)
    const admin = await deps.models.User.findOne({ where: { email: demoAccounts.admin.email } })
    expect(await deps.models.Session.count({ where: { userId: admin!.id } })).toBe(1)

    expect((await a.get('/api/admin/accounts')).status).toBe(200)
    const res = await a.get('/api/admin/mail')
    expect(res.status).toBe(404)
    expect(res.body.error.code).toBe('not_found')
  })

  describe('security headers over plain http', () => {
    const directives = (csp: string) => new Map(csp.split(';').map((d) => d.trim().split(/\s+/)).filter((d) => d[0]).map(([name, ...values]) => [name!, values]))

    it('sends a Content-Security-Policy that allows only this origin for scripts and everything else', async () => {
      const res = await supertest(app).get('/api/auth/csrf')
      const csp = directives(res.headers['content-security-policy'] as string)
      expect(csp.get('default-src')).toEqual(["'self'"])
      expect(csp.get('script-src')).toEqual(["'self'"])
      expect(csp.get('connect-src')).toEqual(["'self'"])
      expect(csp.get('frame-ancestors')).toEqual(["'none'"])
      expect(csp.has('upgrade-insecure-requests')).toBe(false)
      for (const values of csp.values()) for (const v of values) expect(v).not.toMatch(/^(https?:|\*|\/\/)/)
    })

    it('sets Referrer-Policy and Permissions-Policy, no HSTS and no X-Powered-By', async () => {
      const res = await supertest(app).get('/api/nothing-here')
      expect(res.status).toBe(404)
      expect(res.headers['referrer-policy']).toBe('no-referrer')
      expect(res.headers['permissions-policy']).toMatch(/camera=\(\)/)
      expect(res.headers['permissions-policy']).toMatch(/microphone=\(\)/)
      expect(res.headers['permissions-policy']).toMatch(/geolocation=\(\)/)
      expect(res.headers).not.toHaveProperty('strict-transport-security')
      expect(res.headers).not.toHaveProperty('x-powered-by')
    })

    it('adds upgrade-insecure-requests and HSTS only when APP_URL is https', async () => {
      const httpsApp = createApp({ ...deps, config: { ...deps.config, appUrl: 'https://rungs.example.org' } })
      try {
        const res = await supertest(httpsApp).get('/api/auth/csrf')
        expect(directives(res.headers['content-security-policy'] as string).has('upgrade-insecure-requests')).toBe(true)
        expect(res.headers['strict-transport-security']).toMatch(/max-age=31536000/)
      } finally {
        httpsApp.stop()
      }
    })
  })
})
