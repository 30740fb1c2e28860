import type { IncomingMessage, ServerResponse } from 'node:http'
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

/**
 * pino-http with a request id on every request (echoed as X-Request-Id) and `req.log` carrying it. Completed requests
 * are logged only when `logRequests` is on; errors are logged by the error handler either way.
 */
export function httpLogger(logger: Logger, logRequests: boolean) {
  return pinoHttp({
    logger,
    autoLogging: logRequests,
    quietReqLogger: true,
    genReqId(req: IncomingMessage, res: ServerResponse) {
      const id = requestId(req.headers['x-request-id'])
      res.setHeader('X-Request-Id', id)
      return id
    },
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
