import type { ZodType } from 'zod'

// The error shape (and zod with it) is loaded when the first answer fails, so a screen that makes no request never
// carries zod; a failed request already waited for the network.
async function readApiError(status: number, data: unknown): Promise<ApiError> {
  const schema = await import('@shared/schemas/error.schema').then((m) => m.apiErrorSchema, () => undefined)
  const parsed = schema?.safeParse(data)
  return parsed?.success
    ? new ApiError(status, parsed.data.error.code, parsed.data.error.message, parsed.data.error.details)
    : new ApiError(status, 'unexpected', 'The server answered in a way Rungs did not expect. Please try again.')
}

/** An API failure with the server's code and plain message; status 0 means the network could not be reached. */
export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly details?: unknown,
  ) {
    super(message)
  }
}

let csrfToken: string | undefined
let onUnauthenticated: ((err: ApiError) => void) | undefined

/** Called by boot/http.ts: one place decides what a 401 means for the app (the error says why, e.g. session_expired). */
export function setUnauthenticatedHandler(handler: (err: ApiError) => void): void {
  onUnauthenticated = handler
}

/** The server hands out a new token at sign-in and sign-out (the session is regenerated). */
export function setCsrfToken(token: string | undefined): void {
  csrfToken = token
}

async function ensureCsrf(): Promise<string> {
  if (csrfToken) return csrfToken
  const body = await request('GET', '/api/auth/csrf', undefined, undefined, false)
  csrfToken = (body as { csrfToken: string }).csrfToken
  return csrfToken
}

/**
 * The only function that calls fetch. Parses success bodies with the given schema and errors with the shared
 * error shape. Retries once with a fresh CSRF token when the server says the token is stale.
 */
export async function request<T>(method: string, url: string, body?: unknown, schema?: ZodType<T>, retryCsrf = true): Promise<T> {
  const headers: Record<string, string> = { accept: 'application/json' }
  // FormData (a file upload) sets its own multipart content type and boundary.
  const isForm = typeof FormData !== 'undefined' && body instanceof FormData
  if (body !== undefined && !isForm) headers['content-type'] = 'application/json'
  if (method !== 'GET' && method !== 'HEAD') headers['x-csrf-token'] = await ensureCsrf()
  let res: Response
  try {
    res = await fetch(url, { method, headers, credentials: 'same-origin', body: body === undefined ? undefined : isForm ? body : JSON.stringify(body) })
  } catch {
    throw new ApiError(0, 'offline', 'Rungs could not reach the server. Check your connection; nothing you typed is lost.')
  }
  const data: unknown = res.status === 204 ? undefined : await res.json().catch(() => undefined)
  if (!res.ok) {
    const err = await readApiError(res.status, data)
    if (err.code === 'csrf' && retryCsrf) {
      csrfToken = undefined
      return request(method, url, body, schema, false)
    }
    // /api/me answers 401 to every signed-out device; only a timed-out session is news there.
    if (res.status === 401 && (url !== '/api/me' || err.code === 'session_expired')) onUnauthenticated?.(err)
    throw err
  }
  return schema ? schema.parse(data) : (data as T)
}

/**
 * Fetches a file the server offers as a download (CSV, FHIR JSON) and saves it under the server's file name. Errors
 * come back in the one JSON shape, so they are raised as ApiError like any other call.
 */
export async function download(url: string, fallbackName: string): Promise<void> {
  let res: Response
  try {
    res = await fetch(url, { credentials: 'same-origin' })
  } catch {
    throw new ApiError(0, 'offline', 'Rungs could not reach the server. Check your connection and try again.')
  }
  if (!res.ok) {
    const err = await readApiError(res.status, await res.json().catch(() => undefined))
    if (res.status === 401) onUnauthenticated?.(err)
    throw err
  }
  const name = /filename="?([^";]+)"?/.exec(res.headers.get('content-disposition') ?? '')?.[1] ?? fallbackName
  const href = URL.createObjectURL(await res.blob())
  const a = document.createElement('a')
  a.href = href
  a.download = name
  document.body.appendChild(a)
  a.click()
  a.remove()
  setTimeout(() => URL.revokeObjectURL(href), 1000)
}
