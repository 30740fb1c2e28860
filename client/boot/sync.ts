import { watch } from 'vue'
import { hasActiveLink } from '@/db/linksRepository'
import { useSessionStore } from '@/stores/session'

// The outbox, the links store and the share API (with the zod schemas they parse with) load only once this device is
// signed in: a device that never signs in never fetches them, and the first screen paints without them.
const loadSending = () => Promise.all([import('@/stores/links'), import('@/sync/outboxRunner')])

/**
 * Starts the outbox of shares once this device is signed in, and only then (DESIGN.md, Who-am-I: a device never signed in,
 * or with no active link, makes no request while journalling). A signed-in person's links are refreshed first. Only a
 * person shares: a therapist or admin signed in on a device asks for no person links (the server would refuse them).
 */
export function bootSync(): void {
  const session = useSessionStore()
  let sending: ReturnType<typeof loadSending> | undefined

  watch(
    () => (session.status === 'signedIn' ? (session.role === 'person' ? 'person' : 'other') : session.status),
    (status) => {
      if (status === 'person') {
        // A failed load (a new version replaced the files) is tried again at the next sign-in.
        sending ??= loadSending().catch((err: unknown) => {
          sending = undefined
          throw err
        })
        void sending.then(([{ useLinksStore }, { startOutbox }]) => {
          const links = useLinksStore()
          const canSend = async () => session.status === 'signedIn' && session.role === 'person' && !links.paused && (await hasActiveLink())
          links.resume()
          return links
            .refresh()
            .catch(() => undefined)
            .finally(() => startOutbox({ canSend, onReport: links.report }))
        }, () => undefined)
      } else if (status === 'anonymous' || status === 'other') {
        void sending?.then(([, { stopOutbox }]) => stopOutbox(), () => undefined)
      }
    },
  )
  // The server was out of reach at start: ask again when the browser is back online.
  window.addEventListener('online', () => {
    if (session.status === 'unreachable') void session.refresh()
  })
  void session.ready()
}
