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
    await Promise.all([db.entries.clear(), db.trash.clear()])
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
    const undo = await store.remove(e.id)
    await until(() => store.count === 0)
    expect(store.count).toBe(0)
    expect(await undo()).toBe(true)
    await until(() => store.count === 1)
    expect(store.recent[0]?.id).toBe(e.id)
  })
})
