import { createPinia, setActivePinia } from 'pinia'
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { db } from '@/db/db'
import { writeSetting } from '@/db/settingsRepository'
import { useSessionStore } from '@/stores/session'

const me = { id: 'u1', email: 'kit@example.org', displayName: 'Kit', role: 'person', emailVerified: true, emailNotices: true, therapist: null }

describe('useSessionStore.ready', () => {
  beforeEach(async () => {
    setActivePinia(createPinia())
    await db.settings.clear()
  })
  afterEach(() => { vi.unstubAllGlobals() })

  it('never calls the server on a device that has never signed in', async () => {
    const fetch = vi.fn()
    vi.stubGlobal('fetch', fetch)
    const session = useSessionStore()
    await session.ready()
    expect(fetch).not.toHaveBeenCalled()
    expect(session.status).toBe('anonymous')
  })

  it('asks "who am I" once the device has signed in before', async () => {
    const fetch = vi.fn(async (_url: string) => new Response(JSON.stringify({ user: me, features: { sentMail: false } }), { status: 200 }))
    vi.stubGlobal('fetch', fetch)
    await writeSetting('signedInBefore', true)
    const session = useSessionStore()
    await session.ready()
    expect(fetch).toHaveBeenCalledTimes(1)
    expect(fetch.mock.calls[0]?.[0]).toBe('/api/me')
    expect(session.me?.email).toBe('kit@example.org')
  })

  it('treats an unreachable server as unreachable, not as signed out', async () => {
    vi.stubGlobal('fetch', vi.fn(async () => { throw new TypeError('Failed to fetch') }))
    await writeSetting('signedInBefore', true)
    const session = useSessionStore()
    await session.ready()
    expect(session.status).toBe('unreachable')
  })
})
