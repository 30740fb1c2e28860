import { expect } from 'vitest'

export type ApiCall = (method: string, path: string, body?: unknown) => Promise<{ status: number; body: Record<string, unknown> }>

/** Signs in over plain fetch with a small cookie jar and the CSRF token, to act as the other side in a browser test. */
export async function signInOverFetch(base: string, account: { email: string; password: string }): Promise<ApiCall> {
  const jar = new Map<string, string>()
  let csrf = ''
  const call: ApiCall = async (method, path, body) => {
    const headers: Record<string, string> = { accept: 'application/json', cookie: [...jar].map(([k, v]) => `${k}=${v}`).join('; ') }
    if (body !== undefined) headers['content-type'] = 'application/json'
    if (method !== 'GET') headers['x-csrf-token'] = csrf
    const res = await fetch(base + path, { method, headers, body: body === undefined ? undefined : JSON.stringify(body) })
    for (const c of res.headers.getSetCookie()) {
      const [pair] = c.split(';')
      const at = pair!.indexOf('=')
      jar.set(pair!.slice(0, at), pair!.slice(at + 1))
    }
    return { status: res.status, body: (await res.json().catch(() => ({}))) as Record<string, unknown> }
  }
  csrf = String((await call('GET', '/api/auth/csrf')).body.csrfToken)
  const signedIn = await call('POST', '/api/auth/signin', account)
  expect(signedIn.status).toBe(200)
  csrf = String(signedIn.body.csrfToken)
  return call
}
