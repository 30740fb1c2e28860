import { defineStore } from 'pinia'
import type { Entry, EntryInput } from '@shared/schemas/entry.schema'
import { useLiveQuery } from '@/composables/useLiveQuery'
import { countEntries, createEntry, recentEntries, restoreEntry, tagsInUse, trashEntry, updateEntry } from '@/db/entriesRepository'
import { requestPersistentStorage } from '@/db/storageRepository'

/** The journal on this device: recent entries, tags in use, and the write path (Dexie first, visible at once). */
export const useEntriesStore = defineStore('entries', () => {
  const { result: recent, loaded: recentLoaded } = useLiveQuery(() => recentEntries(5), [] as Entry[])
  const { result: tags } = useLiveQuery(() => tagsInUse(), [] as string[])
  const { result: count } = useLiveQuery(() => countEntries(), 0)

  async function create(input: EntryInput): Promise<Entry> {
    const entry = await createEntry(input)
    // The first entry is the moment the journal becomes worth keeping: ask the browser not to evict it.
    void requestPersistentStorage()
    return entry
  }

  async function update(id: string, patch: Partial<EntryInput>): Promise<Entry> {
    return updateEntry(id, patch)
  }

  /** Deletes with an undo: returns the function that brings the entry back. */
  async function remove(id: string): Promise<() => Promise<boolean>> {
    await trashEntry(id)
    return () => restoreEntry(id)
  }

  return { recent, recentLoaded, tags, count, create, update, remove }
})
