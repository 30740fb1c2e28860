import type { IncomingMessage, ServerResponse } from 'node:http'
import type { RequestHandler } from 'express'
import pino, { type DestinationStream, type Logger } from 'pino'
import { pinoHttp } from 'pino-http'
import { requestId } from './requestId'

export type { Logger }

/**
 * Keys whose values never reach a log line, wherever they sit in a logged object. The serializers below already log
 * no headers and no bodies; this is the second lock.
 */
const REDACT = [
  'password', 'newPassword', 'currentPassword', 'token', 'csrfToken', 'sessionId', 'sid', 'cookie', 'body', 'payload', 'text',
  'headers', 'query', 'email',
].flatMap((key) => [key, `*.${key}`])

export interface LoggerOptions {
  level?: string
  /** Where lines go (stdout when absent); tests pass a stream to read them back. */
  destination?: DestinationStream
}

/** The server's one pino logger: JSON lines, sensitive keys removed. */
export function createLogger({ level = 'info', destination }: LoggerOptions = {}): Logger {
  return pino(
    {
      level,
      base: undefined,
      redact: { paths: REDACT, censor: '[redacted]' },
      serializers: { err: errorForLog },
    },
    destination ?? pino.destination(1),
  )
}

export const silentLogger = (): Logger => pino({ level: 'silent' })

/** Type, message, code and stack only: Sequelize errors also carry the SQL and its bound values, which may be entry text. */
export function errorForLog(err: unknown): Record<string, unknown> {
  if (!(err instanceof Error)) return { message: String(err) }
  const code = (err as { code?: unknown }).code
  return { type: err.name, message: err.message, ...(typeof code === 'string' ? { code } : {}), stack: err.stack }
}

/** The path of a request, never its query string (tokens and search words live there). */
export const pathOnly = (url: string | undefined) => (url ?? '').split('?')[0]

const urlOf = (req: IncomingMessage) => pathOnly((req as IncomingMessage & { originalUrl?: string }).originalUrl ?? req.url)

const reqIdOf = (req: IncomingMessage, res: ServerResponse) => {
  const id = requestId(req.headers['x-request-id'])
  res.setHeader('X-Request-Id', id)
  return id
}

/**
 * pino-http with a request id on every request (echoed as X-Request-Id) and `req.log` carrying it, each completed
 * request logged. With `logRequests` off, `requestIds` gives each request the same id, header and `req.log` instead.
 */
export function httpLogger(logger: Logger) {
  return pinoHttp({
    logger,
    autoLogging: true,
    quietReqLogger: true,
    genReqId: reqIdOf,
    serializers: {
      // Method and path only: no headers (cookies, CSRF tokens), no query string, no body.
      req: (req: IncomingMessage) => ({ method: req.method, path: urlOf(req) }),
      // Status only: no headers (Set-Cookie).
      res: (res: ServerResponse) => ({ statusCode: res.statusCode }),
      err: errorForLog,
    },
    wrapSerializers: false,
    customSuccessMessage: (req, res, ms) => `${req.method} ${urlOf(req)} ${res.statusCode} ${ms}ms`,
    customErrorMessage: (req, res) => `${req.method} ${urlOf(req)} ${res.statusCode}`,
    customLogLevel: (_req, res, err) => (err || res.statusCode >= 500 ? 'error' : 'info'),
  })
}

const REQUEST_LOG = Symbol('req.log')
type WithLog = IncomingMessage & { [REQUEST_LOG]?: Logger }

/**
 * With request lines off: the request id and X-Request-Id as httpLogger gives them, and `req.log` (the logger with
 * `reqId`, as pino-http's quietReqLogger makes it) only once something logs, which is only the error handler. pino-http
 * makes two child loggers for every request, one serialising the request through the redaction paths, even when it
 * writes no line: about a twelfth of a cached caseload answer's time. `req.log` is an accessor on the app's request
 * prototype, so each request still gains only its id.
 */
export function requestIds(logger: Logger, requestPrototype: object): RequestHandler {
  Object.defineProperty(requestPrototype, 'log', {
    configurable: true,
    get(this: WithLog) {
      return (this[REQUEST_LOG] ??= logger.child({ reqId: this.id }))
    },
    set(this: WithLog, value: Logger) {
      this[REQUEST_LOG] = value
    },
  })
  return (req, res, next) => {
    req.id = reqIdOf(req, res)
    next()
  }
}
