// A signed-in account over plain fetch (Node's fetch keeps connections alive): a cookie jar, the CSRF token, timings.

export interface Sent {
  status: number
  ms: number
  body: Record<string, unknown>
}

export class BenchClient {
  private cookie = ''
  private csrf = ''

  constructor(private readonly origin: string) {}

  async send(method: string, path: string, body?: unknown): Promise<Sent> {
    const headers: Record<string, string> = { accept: 'application/json' }
    if (this.cookie) headers.cookie = this.cookie
    if (body !== undefined) headers['content-type'] = 'application/json'
    if (method !== 'GET') headers['x-csrf-token'] = this.csrf
    const start = performance.now()
    const res = await fetch(this.origin + path, { method, headers, body: body === undefined ? undefined : JSON.stringify(body) })
    const text = await res.text()
    const ms = performance.now() - start
    const sid = res.headers.getSetCookie().map((c) => c.split(';')[0]!).find((c) => c.startsWith('rungs.sid='))
    if (sid) this.cookie = sid
    let parsed: Record<string, unknown> = {}
    try {
      parsed = JSON.parse(text) as Record<string, unknown>
    } catch {
      // Not JSON (a proxy page, say): the status is what counts.
    }
    return { status: res.status, ms, body: parsed }
  }

  /** GET /api/auth/csrf, then POST /api/auth/signin; keeps the session cookie and the new token. */
  async signIn(email: string, password: string): Promise<void> {
    this.csrf = String((await this.send('GET', '/api/auth/csrf')).body.csrfToken)
    const res = await this.send('POST', '/api/auth/signin', { email, password })
    if (res.status !== 200) throw new Error(`sign-in for ${email} answered ${res.status}`)
    this.csrf = String(res.body.csrfToken)
  }

  get sessionCookie(): string {
    return this.cookie
  }
}
