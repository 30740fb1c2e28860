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
  askAgainWhileUnreachable(session)
  void session.ready()
}

/** Waits between asks while the server is out of reach: soon at first, then once a minute. */
export const UNREACHABLE_RETRY_MS = [5_000, 15_000, 30_000, 60_000]

/**
 * The server was out of reach at start (offline, or the server itself down): ask again when the browser says it is back
 * online, when the app comes back into view, and on a timer meanwhile. The timer is needed: a server that comes back
 * fires no event, and a page opened offline may be told it is online all along, so its 'online' event never comes.
 * Only a device signed in before is ever unreachable (stores/session.ts); one never signed in makes no request.
 */
function askAgainWhileUnreachable(session: ReturnType<typeof useSessionStore>): void {
  let timer: ReturnType<typeof setTimeout> | undefined
  let tries = 0
  const later = () => {
    clearTimeout(timer)
    timer = setTimeout(() => void ask(), UNREACHABLE_RETRY_MS[Math.min(tries++, UNREACHABLE_RETRY_MS.length - 1)])
  }
  const ask = async () => {
    clearTimeout(timer)
    if (session.status !== 'unreachable') return
    await session.refresh()
    if (session.status === 'unreachable') later()
  }
  watch(
    () => session.status,
    (status) => {
      clearTimeout(timer)
      tries = 0
      if (status === 'unreachable') later()
    },
  )
  window.addEventListener('online', () => void ask())
  document.addEventListener('visibilitychange', () => {
    if (document.visibilityState === 'visible') void ask()
  })
}
