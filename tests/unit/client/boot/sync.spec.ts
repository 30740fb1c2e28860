import { flushPromises } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import { afterEach, describe, expect, it, vi } from 'vitest'
import { bootSync } from '@/boot/sync'
import { db } from '@/db/db'
import { writeSetting } from '@/db/settingsRepository'

const me = (role: 'person' | 'therapist' | 'admin') => ({
  user: { id: crypto.randomUUID(), email: `${role}@example.org`, displayName: 'Sam Ellery', role, emailVerified: true, emailNotices: true, therapist: null },
  features: { sentMail: false },
})

/** Boots sending on a device signed in before as `role`, and lists the URLs the app then asked for. */
async function urlsAfterBoot(role: 'person' | 'therapist' | 'admin'): Promise<string[]> {
  setActivePinia(createPinia())
  await writeSetting('signedInBefore', true)
  const urls: string[] = []
  vi.stubGlobal('fetch', async (url: string) => {
    urls.push(url)
    const body = url === '/api/me' ? me(role) : url === '/api/person/links' ? { links: [] } : {}
    return new Response(JSON.stringify(body), { status: 200, headers: { 'content-type': 'application/json' } })
  })
  bootSync()
  return urls
}

/** Lets the session answer and the sending code's dynamic import settle. */
async function settle(urls: string[], until: (urls: string[]) => boolean): Promise<void> {
  await vi.waitFor(() => expect(until(urls)).toBe(true), { timeout: 4000, interval: 20 })
  await flushPromises()
}

afterEach(async () => {
  vi.unstubAllGlobals()
  await db.settings.clear()
})

describe('sending shares after sign-in', () => {
  it('refreshes a signed-in person’s links', async () => {
    const urls = await urlsAfterBoot('person')
    await settle(urls, (u) => u.includes('/api/person/links'))
    expect(urls.filter((u) => u === '/api/person/links')).toHaveLength(1)
  })

  it('asks for no person links when a therapist or an admin is signed in on the device', async () => {
    for (const role of ['therapist', 'admin'] as const) {
      const urls = await urlsAfterBoot(role)
      await settle(urls, (u) => u.includes('/api/me'))
      // As long as a person's boot takes to ask for links (the first test), and then some.
      await new Promise((r) => setTimeout(r, 300))
      expect(urls).toContain('/api/me')
      expect(urls).not.toContain('/api/person/links')
    }
  })
})

describe('a server out of reach at start', () => {
  it('is asked again on a timer, with no online event, and sending starts once it answers', async () => {
    vi.useFakeTimers({ toFake: ['setTimeout', 'clearTimeout'] })
    try {
      setActivePinia(createPinia())
      await writeSetting('signedInBefore', true)
      const urls: string[] = []
      let up = false
      vi.stubGlobal('fetch', async (url: string) => {
        urls.push(url)
        if (!up) throw new TypeError('Failed to fetch')
        const body = url === '/api/me' ? me('person') : url === '/api/person/links' ? { links: [] } : {}
        return new Response(JSON.stringify(body), { status: 200, headers: { 'content-type': 'application/json' } })
      })
      bootSync()
      await vi.waitFor(() => expect(urls).toEqual(['/api/me']), { timeout: 4000, interval: 20 })
      await flushPromises()
      // Still down at the first retry (5 s), up by the second (15 s later): no 'online' event is ever fired.
      await vi.advanceTimersByTimeAsync(5_000)
      await vi.waitFor(() => expect(urls).toEqual(['/api/me', '/api/me']), { timeout: 4000, interval: 20 })
      up = true
      await vi.advanceTimersByTimeAsync(14_000)
      expect(urls.filter((u) => u === '/api/me')).toHaveLength(2)
      await vi.advanceTimersByTimeAsync(1_000)
      await vi.waitFor(() => expect(urls).toContain('/api/person/links'), { timeout: 4000, interval: 20 })
      expect(urls.filter((u) => u === '/api/me')).toHaveLength(3)
    } finally {
      vi.useRealTimers()
    }
  })
})
