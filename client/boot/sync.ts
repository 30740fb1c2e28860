import { watch } from 'vue'
import { hasActiveLink } from '@/db/linksRepository'
import { useLinksStore } from '@/stores/links'
import { useSessionStore } from '@/stores/session'
import { startOutbox, stopOutbox } from '@/sync/outboxRunner'

/**
 * Starts the outbox of shares once this device is signed in, and only then (DESIGN.md, Who-am-I: a device never signed in,
 * or with no active link, makes no request while journalling). A signed-in person's links are refreshed first.
 */
export function bootSync(): void {
  const session = useSessionStore()
  const links = useLinksStore()
  const canSend = async () => session.status === 'signedIn' && !links.paused && (await hasActiveLink())

  watch(
    () => session.status,
    (status) => {
      if (status === 'signedIn') {
        links.resume()
        void links
          .refresh()
          .catch(() => undefined)
          .finally(() => startOutbox({ canSend, onReport: links.report }))
      } else if (status === 'anonymous') {
        stopOutbox()
      }
    },
  )
  // The server was out of reach at start: ask again when the browser is back online.
  window.addEventListener('online', () => {
    if (session.status === 'unreachable') void session.refresh()
  })
  void session.ready()
}
