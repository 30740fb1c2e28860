import { flushPromises } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import { beforeEach, describe, expect, it } from 'vitest'
import { db } from '@/db/db'
import { useEntriesStore } from '@/stores/entries'

async function until(check: () => boolean) {
  for (let i = 0; i < 50 && !check(); i++) await new Promise((r) => setTimeout(r, 10))
  await flushPromises()
}

describe('useEntriesStore', () => {
  beforeEach(async () => {
    await Promise.all([db.entries.clear(), db.trash.clear(), db.outbox.clear()])
    setActivePinia(createPinia())
  })

  it('shows a new entry in recent and tags at once, read through liveQuery', async () => {
    const store = useEntriesStore()
    await store.create({ kind: 'moment', body: 'Rain on the window', wants: [], backgroundThoughts: [], tags: ['calm'] })
    await until(() => store.recent.length === 1 && store.tags.length === 1)
    expect(store.recent[0]?.body).toBe('Rain on the window')
    expect(store.tags).toEqual(['calm'])
    expect(store.count).toBe(1)
  })

  it('deletes with an undo that brings the entry back', async () => {
    const store = useEntriesStore()
    const e = await store.create({ kind: 'moment', body: 'Undo me', wants: [], backgroundThoughts: [], tags: [] })
    const { undo, withdrew } = await store.remove(e.id)
    expect(withdrew).toBe(0)
    await until(() => store.count === 0)
    expect(store.count).toBe(0)
    expect(await undo()).toBe(true)
    await until(() => store.count === 1)
    expect(store.recent[0]?.id).toBe(e.id)
  })

  it('withdraws a shared copy when the entry is deleted, so it is not left readable elsewhere', async () => {
    const store = useEntriesStore()
    const e = await store.create({ kind: 'moment', body: 'Shared then deleted', wants: [], backgroundThoughts: [], tags: [] })
    await store.share(e.id, 'link-1')
    const { withdrew } = await store.remove(e.id)
    expect(withdrew).toBe(1)
    const row = await db.outbox.get(`${e.id}:link-1`)
    expect(row?.op).toBe('delete')
    expect((await db.trash.get(e.id))?.entry.shares[0]?.state).toBe('withdrawing')
  })
})
