import { defineStore } from 'pinia'
import { computed, ref } from 'vue'
import type { LinkPreview } from '@shared/schemas/link.schema'
import type { AccessLogRow } from '@shared/schemas/share.schema'
import * as linksApi from '@/api/links'
import { fetchAccessLog } from '@/api/shares'
import { useLiveQuery } from '@/composables/useLiveQuery'
import { listStoredLinks, saveLink, saveLinks } from '@/db/linksRepository'
import { outboxCounts, rearmOutbox, type OutboxCounts } from '@/db/outboxRepository'
import type { StoredLink } from '@/db/RungsDB'
import type { DrainReport } from '@/sync/outbox'
import { kickOutbox } from '@/sync/outboxRunner'

/** The person's links with therapists (a device copy, so it shows offline) and how sending shares over them is going. */
export const useLinksStore = defineStore('links', () => {
  const { result: links, loaded } = useLiveQuery(() => listStoredLinks(), [] as StoredLink[])
  const { result: counts } = useLiveQuery(() => outboxCounts(), { pending: 0, failed: 0 } as OutboxCounts)
  /** The server said the session ended while sending; nothing is dropped, and sending waits for sign-in. */
  const paused = ref(false)
  const activeLinks = computed(() => links.value.filter((l) => l.state === 'active'))

  async function refresh(): Promise<void> {
    const res = await linksApi.fetchLinks()
    await saveLinks(res.links)
  }

  async function preview(code: string): Promise<LinkPreview> {
    return (await linksApi.previewLink(code)).preview
  }

  async function confirm(code: string): Promise<StoredLink> {
    const { link } = await linksApi.confirmLink(code)
    await saveLink(link)
    return { ...link, syncedAt: Date.now() }
  }

  async function end(linkId: string): Promise<void> {
    await linksApi.endLink(linkId)
    await refresh()
    // Anything still waiting for this link now answers link_not_active and is marked withdrawn.
    void kickOutbox()
  }

  async function accessLog(linkId: string): Promise<AccessLogRow[]> {
    return (await fetchAccessLog(linkId)).events
  }

  function report(r: DrainReport): void {
    paused.value = r.paused
  }

  /** After sign-in: sending resumes with nothing lost, at once (waits from before the pause were guesses, as offline). */
  function resume(): void {
    paused.value = false
    void kickOutbox(true)
  }

  /** The person's retry for failed sends (all, or one entry's, or one entry over one link). */
  async function retry(entryId?: string, linkId?: string): Promise<void> {
    await rearmOutbox(entryId, linkId)
    void kickOutbox()
  }

  return { links, loaded, activeLinks, counts, paused, refresh, preview, confirm, end, accessLog, report, resume, retry }
})
