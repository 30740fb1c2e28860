import { afterEach, describe, expect, it, vi } from 'vitest'
import { ApiError, request, setCsrfToken, setUnauthenticatedHandler } from '@/api/http'

const json = (status: number, body: unknown) => new Response(JSON.stringify(body), { status, headers: { 'content-type': 'application/json' } })

describe('request', () => {
  afterEach(() => {
    vi.unstubAllGlobals()
    setCsrfToken(undefined)
  })

  it('fetches a CSRF token before the first state-changing call and sends it as a header', async () => {
    const fetch = vi.fn()
      .mockResolvedValueOnce(json(200, { csrfToken: 't1' }))
      .mockResolvedValueOnce(json(200, { ok: true }))
    vi.stubGlobal('fetch', fetch)
    await request('POST', '/api/thing', { a: 1 })
    expect(fetch.mock.calls[0]?.[0]).toBe('/api/auth/csrf')
    expect(fetch.mock.calls[1]?.[1].headers['x-csrf-token']).toBe('t1')
  })

  it('retries once with a fresh token when the server says the token is stale', async () => {
    setCsrfToken('old')
    const fetch = vi.fn()
      .mockResolvedValueOnce(json(403, { error: { code: 'csrf', message: 'stale' } }))
      .mockResolvedValueOnce(json(200, { csrfToken: 'new' }))
      .mockResolvedValueOnce(json(200, { ok: true }))
    vi.stubGlobal('fetch', fetch)
    await expect(request('POST', '/api/thing', {})).resolves.toEqual({ ok: true })
    expect(fetch.mock.calls[2]?.[1].headers['x-csrf-token']).toBe('new')
  })

  it('turns the shared error shape into an ApiError and reports 401 once', async () => {
    const onUnauth = vi.fn()
    setUnauthenticatedHandler(onUnauth)
    vi.stubGlobal('fetch', vi.fn().mockResolvedValue(json(401, { error: { code: 'unauthenticated', message: 'Please sign in.' } })))
    const err = await request('GET', '/api/therapist/profile').catch((e: unknown) => e)
    expect(err).toBeInstanceOf(ApiError)
    expect((err as ApiError).code).toBe('unauthenticated')
    expect(onUnauth).toHaveBeenCalledTimes(1)
  })

  it('says plainly when the network is down', async () => {
    vi.stubGlobal('fetch', vi.fn().mockRejectedValue(new TypeError('Failed to fetch')))
    const err = (await request('GET', '/api/me').catch((e: unknown) => e)) as ApiError
    expect(err.status).toBe(0)
    expect(err.message).toContain('nothing you typed is lost')
  })
})
