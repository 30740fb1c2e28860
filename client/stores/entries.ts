import { defineStore } from 'pinia'
import type { Entry, EntryInput } from '@shared/schemas/entry.schema'
import { useLiveQuery } from '@/composables/useLiveQuery'
import { countJournalEntries, createEntry, getEntry, recentEntries, restoreEntry, tagsInUse, trashEntry } from '@/db/entriesRepository'
import { requestPersistentStorage } from '@/db/storageRepository'

// The outbox repository (where an edit and its outbox row are written in one transaction) loads with the first edit,
// share or delete; a new moment never needs it.
const outbox = () => import('@/db/outboxRepository')
// The sending code (the share API and its zod schemas) loads on the first change that may need sending; until the
// outbox has been started after a sign-in, a kick does nothing anyway.
const kickOutbox = (): Promise<void> => import('@/sync/outboxRunner').then((m) => m.kickOutbox(), () => undefined)

/** The journal on this device: recent entries, tags in use, and the write path (Dexie first, visible at once). */
export const useEntriesStore = defineStore('entries', () => {
  const { result: recent, loaded: recentLoaded } = useLiveQuery(() => recentEntries(5), [] as Entry[])
  const { result: tags } = useLiveQuery(() => tagsInUse(), [] as string[])
  const { result: count } = useLiveQuery(() => countJournalEntries(), 0)

  async function create(input: EntryInput): Promise<Entry> {
    const entry = await createEntry(input)
    // The first entry is the moment the journal becomes worth keeping: ask the browser not to evict it.
    void requestPersistentStorage()
    return entry
  }

  /** Saves an edit; a shared entry's copy follows it (one outbox row per link, replaced by each newer version). */
  async function update(id: string, patch: Partial<EntryInput>): Promise<Entry> {
    const entry = await (await outbox()).updateEntryAndRequeue(id, patch)
    if (entry.shares.some((s) => s.state === 'queued')) void kickOutbox()
    return entry
  }

  /** Shares a copy with a linked therapist: written to the device first (waiting to send), then sent when possible. */
  async function share(entryId: string, linkId: string): Promise<void> {
    await (await outbox()).queueShare(entryId, linkId)
    void kickOutbox()
  }

  /** Takes the copy back from the therapist; what they already read may be in their own records. */
  async function withdraw(entryId: string, linkId: string): Promise<void> {
    await (await outbox()).queueWithdraw(entryId, linkId)
    void kickOutbox()
  }

  /**
   * Deletes with an undo: returns the function that brings the entry back. A copy held by a therapist is withdrawn
   * first, so deleting here never leaves the entry readable elsewhere; Undo brings it back private.
   */
  async function remove(id: string): Promise<{ undo: () => Promise<boolean>; withdrew: number }> {
    const entry = await getEntry(id)
    const held = entry?.shares.filter((s) => s.state === 'queued' || s.state === 'shared' || s.state === 'failed') ?? []
    if (held.length) {
      const { queueWithdraw } = await outbox()
      for (const s of held) await queueWithdraw(id, s.linkId)
    }
    await trashEntry(id)
    if (held.length) void kickOutbox()
    return { undo: () => restoreEntry(id), withdrew: held.length }
  }

  return { recent, recentLoaded, tags, count, create, update, share, withdraw, remove }
})
