import type { core } from 'zod'

/** What a 400 tells the client about one field: where, what kind, and the plain message. */
export interface PublicIssue {
  path: (string | number)[]
  code: string
  message: string
}

const MAX_MESSAGE = 200

/**
 * Trims zod issues to path, code and message. The rest (regex patterns, limits, unknown keys copied from the request)
 * helps nobody filling in a form and only tells a prober how the server checks.
 */
export function publicIssues(issues: readonly core.$ZodIssue[], prefix: (string | number)[] = []): PublicIssue[] {
  return issues.map((i) => ({
    path: [...prefix, ...i.path.map((p) => (typeof p === 'symbol' ? String(p) : p))],
    code: i.code,
    message: i.code === 'unrecognized_keys' ? 'This field is not expected here.' : i.message.slice(0, MAX_MESSAGE),
  }))
}
