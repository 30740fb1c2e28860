import type { ErrorRequestHandler } from 'express'
import { UniqueConstraintError } from 'sequelize'
import { ZodError } from 'zod'
import type { Logger } from '../log/logger'
import { HttpError } from './HttpError'
import { publicIssues } from './publicIssues'

/**
 * Maps every thrown error to the one error shape. Unknown errors become 500 with the message hidden: the stack, file
 * paths and any SQL stay in the server's log, under the request id.
 */
export function errorHandler(log: Logger): ErrorRequestHandler {
  return (err, req, res, _next) => {
    if (res.headersSent) {
      ;(req.log ?? log).error({ err, method: req.method, path: req.path }, 'request failed after the response started')
      if (!res.writableEnded) res.end()
      return
    }
    if (err instanceof HttpError) {
      res.status(err.status).json({ error: { code: err.code, message: err.message, ...(err.details ? { details: err.details } : {}) } })
      return
    }
    if (err instanceof ZodError) {
      res.status(400).json({ error: { code: 'invalid_input', message: 'Some fields need another look.', details: publicIssues(err.issues) } })
      return
    }
    if (err instanceof UniqueConstraintError) {
      res.status(409).json({ error: { code: 'conflict', message: 'That already exists.' } })
      return
    }
    if (err?.code === 'EBADCSRFTOKEN') {
      res.status(403).json({ error: { code: 'csrf', message: 'This page has been open a while. Reload it and try again.' } })
      return
    }
    // body-parser errors carry a status and a type, e.g. entity.parse.failed or entity.too.large.
    const status = typeof err?.status === 'number' ? err.status : typeof err?.statusCode === 'number' ? err.statusCode : 500
    if (status >= 400 && status < 500) {
      const code = err?.type === 'entity.too.large' ? 'too_large' : err?.type === 'entity.parse.failed' ? 'bad_json' : 'bad_request'
      const message = code === 'too_large' ? 'That request is too large.' : code === 'bad_json' ? 'The request body is not valid JSON.' : 'The request could not be read.'
      res.status(status).json({ error: { code, message } })
      return
    }
    ;(req.log ?? log).error({ err, method: req.method, path: req.path }, 'request failed')
    res.status(500).json({ error: { code: 'internal', message: 'Something went wrong on our side. Nothing you sent was lost; please try again.' } })
  }
}
