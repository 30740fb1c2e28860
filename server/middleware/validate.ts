import type { RequestHandler } from 'express'
import type { ZodType } from 'zod'
import { HttpError } from './HttpError'

interface Schemas {
  body?: ZodType
  params?: ZodType
  query?: ZodType
}

/** Validates the parts of a request with shared zod schemas; parsed values replace the raw ones. */
export function validate(schemas: Schemas): RequestHandler {
  return (req, _res, next) => {
    const issues: unknown[] = []
    for (const part of ['params', 'query', 'body'] as const) {
      const schema = schemas[part]
      if (!schema) continue
      const result = schema.safeParse(req[part] ?? {})
      if (!result.success) {
        issues.push(...result.error.issues.map((i) => ({ ...i, path: [part, ...i.path] })))
        continue
      }
      // Express 5 exposes req.query through a getter; redefine it rather than assign.
      Object.defineProperty(req, part, { value: result.data, writable: true, configurable: true, enumerable: true })
    }
    if (issues.length) {
      const first = issues[0] as { message?: string }
      throw new HttpError(400, 'invalid_input', first.message ?? 'Some fields need another look.', issues)
    }
    next()
  }
}
