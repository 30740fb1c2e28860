import type { AddressInfo } from 'node:net'
import http, { type Server } from 'node:http'
import { createApp } from './app'
import { databaseTarget, type Config } from './config/env'
import { prepareDatabase } from './db/prepareDatabase'
import { openDatabase } from './db/sequelize'
import type { AppDeps } from './deps'
import { startFakeSmtp } from './mail/fakeSmtp'
import { createMailer } from './mail/transport'

export interface Running {
  url: string
  server: Server
  deps: AppDeps
  close(): Promise<void>
}

/** Opens and migrates the database, seeds the demo when empty, starts mail, and listens. */
export async function startServer(config: Readonly<Config>, log: (line: string) => void = console.log): Promise<Running> {
  const sequelize = await openDatabase(databaseTarget(config))
  const { models, applied, seeded } = await prepareDatabase(sequelize, config)
  if (applied.length) log(`database: applied ${applied.join(', ')}`)
  if (seeded) log('database: seeded the demo accounts (see README)')

  const fakeSmtp = config.smtpUrl
    ? undefined
    : await startFakeSmtp({ port: config.fakeSmtpPort, env: config.env, allowInProduction: config.allowFakeSmtpInProduction })
  if (fakeSmtp) log(`mail: local fake SMTP on 127.0.0.1:${fakeSmtp.port}; read it on the admin "Sent mail" page`)
  const mailer = createMailer({ smtpUrl: config.smtpUrl, fakePort: fakeSmtp?.port, from: config.mailFrom })

  // Listen first, so that with PORT=0 the links in e-mails can name the port actually chosen.
  const server = http.createServer()
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject)
    server.listen(config.port, config.host, () => resolve())
  })
  const port = (server.address() as AddressInfo).port
  const host = config.host === '0.0.0.0' || config.host === '127.0.0.1' ? 'localhost' : config.host
  const finalConfig = config.port === 0 && config.appUrl === 'http://localhost:0' ? Object.freeze({ ...config, appUrl: `http://${host}:${port}` }) : config

  const deps: AppDeps = { config: finalConfig, sequelize, models, mailer, fakeSmtp, log }
  const app = createApp(deps)
  server.on('request', app)

  let closing: Promise<void> | undefined
  const close = () =>
    (closing ??= (async () => {
      // In-flight requests finish; idle keep-alive sockets are closed so shutdown does not hang.
      await new Promise<void>((resolve) => {
        server.close(() => resolve())
        server.closeIdleConnections()
      })
      app.stop()
      mailer.close()
      await fakeSmtp?.close()
      await sequelize.close()
    })())
  return { url: `http://${host}:${port}`, server, deps, close }
}
