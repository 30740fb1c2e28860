import { randomUUID } from 'node:crypto'

// Letters, digits and . _ : - only, 8 to 128 long: enough for UUIDs and common tracing ids, nothing a log viewer could
// mistake for markup or a new line.
const SAFE_REQUEST_ID = /^[A-Za-z0-9][A-Za-z0-9._:-]{7,127}$/

/** The request id for a request: an incoming X-Request-Id when it looks safe, else a fresh UUID. */
export function requestId(incoming: string | string[] | undefined): string {
  return typeof incoming === 'string' && SAFE_REQUEST_ID.test(incoming) ? incoming : randomUUID()
}
