import type { AddressInfo } from 'node:net'
import http, { STATUS_CODES, type Server } from 'node:http'
import type { Duplex } from 'node:stream'
import { createApp } from './app'
import { appMessages } from './appMessages'
import { databaseTarget, type Config } from './config/env'
import { prepareDatabase } from './db/prepareDatabase'
import { openDatabase } from './db/sequelize'
import type { AppDeps } from './deps'
import { createLogger, type Logger } from './log/logger'
import { startFakeSmtp } from './mail/fakeSmtp'
import { createMailer } from './mail/transport'

export interface Running {
  url: string
  server: Server
  deps: AppDeps
  /** Stops taking connections, lets open requests finish (up to `graceMs`), then closes mail and the database. */
  close(options?: { graceMs?: number }): Promise<void>
}

/**
 * Requests Node's HTTP parser refuses before Express sees them (a URL or headers over 16 kB, broken framing) get the
 * one error shape too, instead of a bare status line.
 */
export function answerClientErrors(server: Server): void {
  server.on('clientError', (err: NodeJS.ErrnoException, socket: Duplex) => {
    if (err.code === 'ECONNRESET' || !socket.writable) {
      socket.destroy()
      return
    }
    const status = err.code === 'HPE_HEADER_OVERFLOW' ? 431 : err.code === 'ERR_HTTP_REQUEST_TIMEOUT' ? 408 : 400
    const error = status === 431
      ? { code: 'too_large', message: 'The address or headers of that request are too large.' }
      : { code: 'bad_request', message: 'The request could not be read.' }
    const body = JSON.stringify({ error })
    socket.end(
      `HTTP/1.1 ${status} ${STATUS_CODES[status]}\r\nContent-Type: application/json; charset=utf-8\r\n` +
        `Content-Length: ${Buffer.byteLength(body)}\r\nConnection: close\r\n\r\n${body}`,
    )
  })
}

/** Opens and migrates the database, seeds the demo when empty, starts mail, and listens. */
export async function startServer(config: Readonly<Config>, log: Logger = createLogger({ level: config.logLevel })): Promise<Running> {
  const sequelize = await openDatabase(databaseTarget(config))
  const { models, applied, seeded } = await prepareDatabase(sequelize, config)
  if (applied.length) log.info(`database: applied ${applied.join(', ')}`)
  if (seeded) log.info('database: seeded the demo accounts (see README)')

  const fakeSmtp = config.smtpUrl
    ? undefined
    : await startFakeSmtp({ port: config.fakeSmtpPort, env: config.env, allowInProduction: config.allowFakeSmtpInProduction })
  if (fakeSmtp) log.info(`mail: local fake SMTP on 127.0.0.1:${fakeSmtp.port}; read it on the admin "Sent mail" page`)
  const mailer = createMailer({ smtpUrl: config.smtpUrl, fakePort: fakeSmtp?.port, from: config.mailFrom })

  // Listen first, so that with PORT=0 the links in e-mails can name the port actually chosen.
  // Requests and responses are born with the app's prototypes once it exists (appMessages.ts).
  const messages = appMessages()
  const server = http.createServer(messages.options)
  answerClientErrors(server)
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject)
    server.listen(config.port, config.host, () => resolve())
  })
  const port = (server.address() as AddressInfo).port
  const host = config.host === '0.0.0.0' || config.host === '127.0.0.1' ? 'localhost' : config.host
  const finalConfig = config.port === 0 && config.appUrl === 'http://localhost:0' ? Object.freeze({ ...config, appUrl: `http://${host}:${port}` }) : config

  const deps: AppDeps = { config: finalConfig, sequelize, models, mailer, fakeSmtp, log }
  const app = createApp(deps)
  messages.adopt(app)
  let closing: Promise<void> | undefined
  // Once closing, a request that still arrives on an open keep-alive socket is answered and that socket then closed.
  server.on('request', (_req, res) => {
    if (closing) res.setHeader('Connection', 'close')
  })
  server.on('request', app)

  const close = ({ graceMs = 10_000 } = {}) =>
    (closing ??= (async () => {
      // No new connections from here; requests in flight finish. Idle keep-alive sockets are closed now, and busy ones
      // as soon as their response is sent (the Connection: close set above).
      await new Promise<void>((resolve) => {
        const force = setTimeout(() => {
          log.warn(`shutdown: requests still open after ${graceMs} ms, closing their connections`)
          server.closeAllConnections()
        }, graceMs)
        force.unref()
        server.close(() => {
          clearTimeout(force)
          resolve()
        })
        server.closeIdleConnections()
      })
      app.stop()
      mailer.close()
      await fakeSmtp?.close()
      // Fold the WAL back into the database file, so the file alone is a complete copy once the process has gone.
      await sequelize.query('PRAGMA wal_checkpoint(TRUNCATE);').catch((err: unknown) => log.warn({ err }, 'shutdown: WAL checkpoint failed'))
      await sequelize.close()
    })())
  return { url: `http://${host}:${port}`, server, deps, close }
}
