import type { RequestHandler } from 'express'
import type { ZodType } from 'zod'
import { HttpError } from './HttpError'
import { publicIssues, type PublicIssue } from './publicIssues'

interface Schemas {
  body?: ZodType
  params?: ZodType
  query?: ZodType
}

/**
 * The path of the first string holding U+0000. PostgreSQL cannot store it in text (Sequelize would write a backslash and
 * a zero instead), so it is refused on every database and the same text means the same thing on both. A shared entry's
 * `payload` is exempt: it is stored as JSON text, where U+0000 is escaped, so an entry is never kept from sharing.
 */
function nulPath(value: unknown, path: (string | number)[] = []): (string | number)[] | undefined {
  if (typeof value === 'string') return value.includes('\u0000') ? path : undefined
  if (value && typeof value === 'object') {
    for (const [k, v] of Object.entries(value)) {
      if (path.length === 0 && k === 'payload') continue
      const found = nulPath(v, [...path, Array.isArray(value) ? Number(k) : k])
      if (found) return found
    }
  }
  return undefined
}

/** Validates the parts of a request with shared zod schemas; parsed values replace the raw ones. */
export function validate(schemas: Schemas): RequestHandler {
  return (req, _res, next) => {
    const issues: PublicIssue[] = []
    for (const part of ['params', 'query', 'body'] as const) {
      const schema = schemas[part]
      if (!schema) continue
      const result = schema.safeParse(req[part] ?? {})
      if (!result.success) {
        issues.push(...publicIssues(result.error.issues, [part]))
        continue
      }
      const nul = nulPath(result.data)
      if (nul) {
        issues.push({ code: 'custom', path: [part, ...nul], message: 'Text cannot contain the character U+0000.' })
        continue
      }
      // Express 5 exposes req.query through a getter; redefine it rather than assign.
      Object.defineProperty(req, part, { value: result.data, writable: true, configurable: true, enumerable: true })
    }
    if (issues.length) {
      throw new HttpError(400, 'invalid_input', issues[0]!.message, issues)
    }
    next()
  }
}
